/**
 * A genetic-rescue proposal for one recipient subpopulation: sources, narrative, outbreeding
 * checklist, scenarios and the review trail. Table `proposals`.
 *
 * Status flow: draft → submitted → approved / returned / declined; 'withdrawn' from draft or
 * submitted. CHECK constraints keep `submittedAt` set once a proposal has left draft (except
 * a withdrawn draft), `decidedAt` set on approved / returned / declined, and the recipient out
 * of its own source list. `recommendedScenarioId` must name a scenario of this proposal
 * (composite foreign key); `revisesId` points at the proposal this one revises.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { PROPOSAL_STATUSES, type ProposalStatus } from '../../../shared/types/db'
import type { Comment } from './Comment'
import type { Decision } from './Decision'
import type { Scenario } from './Scenario'
import type { Subpopulation } from './Subpopulation'
import type { User } from './User'

export class Proposal extends Model<InferAttributes<Proposal>, InferCreationAttributes<Proposal>> {
  declare id: CreationOptional<number>
  declare agencyId: number
  declare recipientId: number
  declare title: string
  declare purpose: CreationOptional<string>
  declare status: CreationOptional<ProposalStatus>
  declare authorId: number
  declare reviewerId: CreationOptional<number | null>
  /** Wild source subpopulations (ids of this agency's subpopulations). */
  declare sourceSubpopulationIds: CreationOptional<number[]>
  /** A captive or other non-recorded source, described in words. */
  declare captiveSource: CreationOptional<string | null>
  /** Narrative sections (rationale, monitoring plan, risks …). */
  declare narrative: CreationOptional<Record<string, unknown>>
  declare outbreedingAnswers: CreationOptional<Record<string, unknown>>
  declare checklist: CreationOptional<Record<string, unknown>>
  declare recommendedScenarioId: CreationOptional<number | null>
  declare revisesId: CreationOptional<number | null>
  declare submittedAt: CreationOptional<Date | null>
  declare decidedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare recipient?: NonAttribute<Subpopulation>
  declare author?: NonAttribute<User>
  declare reviewer?: NonAttribute<User | null>
  declare scenarios?: NonAttribute<Scenario[]>
  declare recommendedScenario?: NonAttribute<Scenario | null>
  declare decisions?: NonAttribute<Decision[]>
  declare comments?: NonAttribute<Comment[]>
  declare revises?: NonAttribute<Proposal | null>

  static initModel(sequelize: Sequelize): typeof Proposal {
    Proposal.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      agencyId: { type: DataTypes.INTEGER, allowNull: false },
      recipientId: { type: DataTypes.INTEGER, allowNull: false },
      title: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      purpose: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'draft', validate: { isIn: [[...PROPOSAL_STATUSES]] } },
      authorId: { type: DataTypes.INTEGER, allowNull: false },
      reviewerId: { type: DataTypes.INTEGER, allowNull: true },
      sourceSubpopulationIds: { type: DataTypes.ARRAY(DataTypes.INTEGER), allowNull: false, defaultValue: [] },
      captiveSource: { type: DataTypes.TEXT, allowNull: true },
      narrative: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      outbreedingAnswers: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      checklist: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      recommendedScenarioId: { type: DataTypes.INTEGER, allowNull: true },
      revisesId: { type: DataTypes.INTEGER, allowNull: true },
      submittedAt: { type: DataTypes.DATE, allowNull: true },
      decidedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'Proposal', tableName: 'proposals', underscored: true, version: true })
    return Proposal
  }
}
