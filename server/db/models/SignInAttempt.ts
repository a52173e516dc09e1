/**
 * One sign-in attempt, kept for rate limiting. `key` names what is limited: 'account:<email>'
 * or 'address:<ip>'; the limiter counts recent failures per key (index on key, attempted_at).
 * Old rows can be deleted freely. Table `sign_in_attempts`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

export class SignInAttempt extends Model<InferAttributes<SignInAttempt>, InferCreationAttributes<SignInAttempt>> {
  declare id: CreationOptional<number>
  declare key: string
  declare attemptedAt: CreationOptional<Date>
  declare succeeded: boolean

  static initModel(sequelize: Sequelize): typeof SignInAttempt {
    SignInAttempt.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      key: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      attemptedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
    }, { sequelize, modelName: 'SignInAttempt', tableName: 'sign_in_attempts', underscored: true, timestamps: false })
    return SignInAttempt
  }
}
