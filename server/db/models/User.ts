/**
 * A person who signs in, member of one agency with one role. Table `users`.
 *
 * E-mail addresses are stored trimmed and lower-cased (a CHECK refuses anything else) and are
 * unique across all agencies, so sign-in by e-mail is unambiguous. `passwordHash` stays null
 * until an invitation is accepted; it holds the PHC-format scrypt hash that nuxt-auth-utils'
 * `hashPassword` produces. Bumping `sessionVersion` signs the user out everywhere.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { ROLES, type Role } from '../../../shared/types/db'
import type { Agency } from './Agency'

/** Normalises an e-mail address the way the database stores it. */
export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase()
}

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>
  declare agencyId: number
  declare email: string
  declare name: string
  declare role: Role
  declare passwordHash: CreationOptional<string | null>
  declare active: CreationOptional<boolean>
  declare sessionVersion: CreationOptional<number>
  declare lastSignInAt: CreationOptional<Date | null>
  declare invitedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare agency?: NonAttribute<Agency>

  static initModel(sequelize: Sequelize): typeof User {
    User.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      agencyId: { type: DataTypes.INTEGER, allowNull: false },
      email: {
        type: DataTypes.TEXT,
        allowNull: false,
        set(value: string) {
          this.setDataValue('email', normaliseEmail(value))
        },
      },
      name: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      role: { type: DataTypes.TEXT, allowNull: false, validate: { isIn: [[...ROLES]] } },
      passwordHash: { type: DataTypes.TEXT, allowNull: true },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      sessionVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      lastSignInAt: { type: DataTypes.DATE, allowNull: true },
      invitedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'User', tableName: 'users', underscored: true, version: true })
    return User
  }
}
