/**
 * A one-time token e-mailed to a user (invitation or password reset). Only the SHA-256 hex
 * digest of the random token is stored, so a database leak does not leak usable links.
 * Table `user_tokens`.
 */
import { createHash } from 'node:crypto'
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { TOKEN_PURPOSES, type TokenPurpose } from '../../../shared/types/db'
import type { User } from './User'

/** SHA-256 hex digest of a token, the form stored in `user_tokens.token_hash`. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}

export class UserToken extends Model<InferAttributes<UserToken>, InferCreationAttributes<UserToken>> {
  declare id: CreationOptional<number>
  declare userId: number
  declare purpose: TokenPurpose
  /** SHA-256 hex digest (64 lower-case hex characters) of the token sent by e-mail. */
  declare tokenHash: string
  declare expiresAt: Date
  declare usedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>

  declare user?: NonAttribute<User>

  static initModel(sequelize: Sequelize): typeof UserToken {
    UserToken.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      userId: { type: DataTypes.INTEGER, allowNull: false },
      purpose: { type: DataTypes.TEXT, allowNull: false, validate: { isIn: [[...TOKEN_PURPOSES]] } },
      tokenHash: { type: DataTypes.TEXT, allowNull: false, validate: { is: /^[0-9a-f]{64}$/ } },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
    }, { sequelize, modelName: 'UserToken', tableName: 'user_tokens', underscored: true, updatedAt: false })
    return UserToken
  }
}
