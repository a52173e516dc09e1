/**
 * A comment on a proposal. `mentions` holds the ids of users mentioned (for notifications).
 * Table `comments`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Proposal } from './Proposal'
import type { User } from './User'

export class Comment extends Model<InferAttributes<Comment>, InferCreationAttributes<Comment>> {
  declare id: CreationOptional<number>
  declare proposalId: number
  declare authorId: number
  declare body: string
  declare mentions: CreationOptional<number[]>
  declare createdAt: CreationOptional<Date>

  declare proposal?: NonAttribute<Proposal>
  declare author?: NonAttribute<User>

  static initModel(sequelize: Sequelize): typeof Comment {
    Comment.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      proposalId: { type: DataTypes.INTEGER, allowNull: false },
      authorId: { type: DataTypes.INTEGER, allowNull: false },
      body: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      mentions: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      createdAt: DataTypes.DATE,
    }, { sequelize, modelName: 'Comment', tableName: 'comments', underscored: true, updatedAt: false })
    return Comment
  }
}
