/**
 * A manager's decision on a submitted proposal. Immutable once written. A return or a decline
 * must carry a non-blank comment (CHECK); an approval may leave it empty. Table `decisions`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { DECISION_KINDS, type DecisionKind } from '../../../shared/types/db'
import type { Proposal } from './Proposal'
import type { User } from './User'

export class Decision extends Model<InferAttributes<Decision>, InferCreationAttributes<Decision>> {
  declare id: CreationOptional<number>
  declare proposalId: number
  declare decidedBy: number
  declare decision: DecisionKind
  declare comment: string
  declare createdAt: CreationOptional<Date>

  declare proposal?: NonAttribute<Proposal>
  declare decider?: NonAttribute<User>

  static initModel(sequelize: Sequelize): typeof Decision {
    Decision.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      proposalId: { type: DataTypes.INTEGER, allowNull: false },
      decidedBy: { type: DataTypes.INTEGER, allowNull: false },
      decision: { type: DataTypes.TEXT, allowNull: false, validate: { isIn: [[...DECISION_KINDS]] } },
      comment: { type: DataTypes.TEXT, allowNull: false },
      createdAt: DataTypes.DATE,
    }, { sequelize, modelName: 'Decision', tableName: 'decisions', underscored: true, updatedAt: false })
    return Decision
  }
}
