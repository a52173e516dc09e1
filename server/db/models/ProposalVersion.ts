/**
 * One saved state of a proposal (migration 0005): the proposal DTO after a create or a PATCH,
 * which top-level fields that save changed, who saved it and when. Table `proposal_versions`;
 * rows are only inserted (server/utils/proposal-versions.ts), never updated.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Proposal } from './Proposal'
import type { User } from './User'

export class ProposalVersion extends Model<InferAttributes<ProposalVersion>, InferCreationAttributes<ProposalVersion>> {
  declare id: CreationOptional<number>
  declare proposalId: number
  /** The proposal's `version` after this save. */
  declare version: number
  /** The proposal DTO after this save (shared/schemas/proposal.ts ProposalDto). */
  declare snapshot: Record<string, unknown>
  declare changedFields: CreationOptional<string[]>
  declare savedBy: CreationOptional<number | null>
  declare savedAt: CreationOptional<Date>

  declare proposal?: NonAttribute<Proposal>
  declare saver?: NonAttribute<User | null>

  static initModel(sequelize: Sequelize): typeof ProposalVersion {
    ProposalVersion.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      proposalId: { type: DataTypes.INTEGER, allowNull: false },
      version: { type: DataTypes.INTEGER, allowNull: false },
      snapshot: { type: DataTypes.JSONB, allowNull: false },
      changedFields: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
      savedBy: { type: DataTypes.INTEGER, allowNull: true },
      savedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    }, { sequelize, modelName: 'ProposalVersion', tableName: 'proposal_versions', underscored: true, timestamps: false })
    return ProposalVersion
  }
}
