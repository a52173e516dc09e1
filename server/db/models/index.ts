/**
 * Initialises every model on a Sequelize instance and declares the associations.
 *
 * The tables themselves come from the migrations (server/db/migrations): the attribute lists
 * here must match them, and `sync()` is never called. Foreign keys and their ON DELETE
 * behaviour are declared in the migration; the associations below only tell Sequelize how to
 * join (`constraints: false` keeps Sequelize from inventing its own).
 */
import type { Sequelize } from 'sequelize'
import { Agency } from './Agency'
import { Attachment } from './Attachment'
import { AuditEvent } from './AuditEvent'
import { CensusCount } from './CensusCount'
import { Comment } from './Comment'
import { Decision } from './Decision'
import { EffectiveSizeEstimate } from './EffectiveSizeEstimate'
import { GeneticDataset } from './GeneticDataset'
import { IssuedBrief } from './IssuedBrief'
import { MonitoringObservation } from './MonitoringObservation'
import { OutboxMessage } from './OutboxMessage'
import { Proposal } from './Proposal'
import { ProposalVersion } from './ProposalVersion'
import { Scenario } from './Scenario'
import { SignInAttempt } from './SignInAttempt'
import { SimulationRun } from './SimulationRun'
import { Translocation } from './Translocation'
import { Species } from './Species'
import { Subpopulation } from './Subpopulation'
import { User } from './User'
import { UserToken } from './UserToken'

export { Agency, Attachment, AuditEvent, CensusCount, Comment, Decision, EffectiveSizeEstimate, GeneticDataset, OutboxMessage, Proposal, ProposalVersion, Scenario, SignInAttempt, Species, Subpopulation, User, UserToken }
export { MonitoringObservation, Translocation }
export { SimulationRun }
export { IssuedBrief }
export type { AnimalSex, MovedAnimal } from './Translocation'
export { normaliseEmail } from './User'
export { hashToken } from './UserToken'
export type { SubpopulationGeometry } from './Subpopulation'

const models = {
  Agency,
  Attachment,
  AuditEvent,
  CensusCount,
  Comment,
  Decision,
  EffectiveSizeEstimate,
  GeneticDataset,
  IssuedBrief,
  MonitoringObservation,
  OutboxMessage,
  Proposal,
  ProposalVersion,
  Scenario,
  SignInAttempt,
  SimulationRun,
  Species,
  Subpopulation,
  Translocation,
  User,
  UserToken,
}

export type Models = typeof models

/** The Sequelize instance the model classes are bound to now (classes are process-wide). */
let boundTo: Sequelize | undefined

/**
 * Binds all models to `sequelize` and declares their associations; calling it again with the
 * same instance is a no-op. The classes are process-wide singletons, so binding them to a
 * second instance moves them there (the first instance then has no models).
 *
 * @param sequelize - the connection to bind to
 * @returns the model classes, keyed by class name
 */
export function initModels(sequelize: Sequelize): Models {
  if (boundTo === sequelize) return models
  for (const model of Object.values(models)) model.initModel(sequelize)
  associate()
  boundTo = sequelize
  return models
}

function associate(): void {
  const noConstraint = { constraints: false } as const

  Agency.hasMany(User, { ...noConstraint, foreignKey: 'agencyId', as: 'users' })
  Agency.hasMany(Species, { ...noConstraint, foreignKey: 'agencyId', as: 'species' })
  Agency.hasMany(Subpopulation, { ...noConstraint, foreignKey: 'agencyId', as: 'subpopulations' })
  Agency.hasMany(Proposal, { ...noConstraint, foreignKey: 'agencyId', as: 'proposals' })

  User.belongsTo(Agency, { ...noConstraint, foreignKey: 'agencyId', as: 'agency' })
  User.hasMany(UserToken, { ...noConstraint, foreignKey: 'userId', as: 'tokens' })
  UserToken.belongsTo(User, { ...noConstraint, foreignKey: 'userId', as: 'user' })

  Species.belongsTo(Agency, { ...noConstraint, foreignKey: 'agencyId', as: 'agency' })
  Species.hasMany(Subpopulation, { ...noConstraint, foreignKey: 'speciesId', as: 'subpopulations' })

  Subpopulation.belongsTo(Agency, { ...noConstraint, foreignKey: 'agencyId', as: 'agency' })
  Subpopulation.belongsTo(Species, { ...noConstraint, foreignKey: 'speciesId', as: 'species' })
  Subpopulation.hasMany(CensusCount, { ...noConstraint, foreignKey: 'subpopulationId', as: 'censusCounts' })
  Subpopulation.hasMany(EffectiveSizeEstimate, { ...noConstraint, foreignKey: 'subpopulationId', as: 'effectiveSizeEstimates' })
  Subpopulation.hasMany(GeneticDataset, { ...noConstraint, foreignKey: 'subpopulationId', as: 'geneticDatasets' })
  CensusCount.belongsTo(Subpopulation, { ...noConstraint, foreignKey: 'subpopulationId', as: 'subpopulation' })
  EffectiveSizeEstimate.belongsTo(Subpopulation, { ...noConstraint, foreignKey: 'subpopulationId', as: 'subpopulation' })
  EffectiveSizeEstimate.belongsTo(User, { ...noConstraint, foreignKey: 'createdBy', as: 'creator' })
  GeneticDataset.belongsTo(Subpopulation, { ...noConstraint, foreignKey: 'subpopulationId', as: 'subpopulation' })
  GeneticDataset.belongsTo(User, { ...noConstraint, foreignKey: 'createdBy', as: 'creator' })

  Proposal.belongsTo(Agency, { ...noConstraint, foreignKey: 'agencyId', as: 'agency' })
  Proposal.belongsTo(Subpopulation, { ...noConstraint, foreignKey: 'recipientId', as: 'recipient' })
  Proposal.belongsTo(User, { ...noConstraint, foreignKey: 'authorId', as: 'author' })
  Proposal.belongsTo(User, { ...noConstraint, foreignKey: 'reviewerId', as: 'reviewer' })
  Proposal.belongsTo(Proposal, { ...noConstraint, foreignKey: 'revisesId', as: 'revises' })
  Proposal.hasMany(Proposal, { ...noConstraint, foreignKey: 'revisesId', as: 'revisions' })
  Proposal.hasMany(Scenario, { ...noConstraint, foreignKey: 'proposalId', as: 'scenarios' })
  Proposal.belongsTo(Scenario, { ...noConstraint, foreignKey: 'recommendedScenarioId', as: 'recommendedScenario' })
  Proposal.hasMany(Decision, { ...noConstraint, foreignKey: 'proposalId', as: 'decisions' })
  Proposal.hasMany(Comment, { ...noConstraint, foreignKey: 'proposalId', as: 'comments' })
  Scenario.belongsTo(Proposal, { ...noConstraint, foreignKey: 'proposalId', as: 'proposal' })
  Proposal.hasMany(ProposalVersion, { ...noConstraint, foreignKey: 'proposalId', as: 'versions' })
  ProposalVersion.belongsTo(Proposal, { ...noConstraint, foreignKey: 'proposalId', as: 'proposal' })
  ProposalVersion.belongsTo(User, { ...noConstraint, foreignKey: 'savedBy', as: 'saver' })
  Decision.belongsTo(Proposal, { ...noConstraint, foreignKey: 'proposalId', as: 'proposal' })
  Decision.belongsTo(User, { ...noConstraint, foreignKey: 'decidedBy', as: 'decider' })
  Comment.belongsTo(Proposal, { ...noConstraint, foreignKey: 'proposalId', as: 'proposal' })
  Comment.belongsTo(User, { ...noConstraint, foreignKey: 'authorId', as: 'author' })

  Attachment.belongsTo(Agency, { ...noConstraint, foreignKey: 'agencyId', as: 'agency' })
  Attachment.belongsTo(User, { ...noConstraint, foreignKey: 'uploadedBy', as: 'uploader' })
  AuditEvent.belongsTo(Agency, { ...noConstraint, foreignKey: 'agencyId', as: 'agency' })
  AuditEvent.belongsTo(User, { ...noConstraint, foreignKey: 'actorId', as: 'actor' })
  OutboxMessage.belongsTo(Agency, { ...noConstraint, foreignKey: 'agencyId', as: 'agency' })

  // Monitoring after approval (migration 0007).
  Proposal.hasMany(Translocation, { ...noConstraint, foreignKey: 'proposalId', as: 'translocations' })
  Translocation.belongsTo(Proposal, { ...noConstraint, foreignKey: 'proposalId', as: 'proposal' })
  Translocation.belongsTo(Subpopulation, { ...noConstraint, foreignKey: 'sourceId', as: 'source' })
  Translocation.belongsTo(Subpopulation, { ...noConstraint, foreignKey: 'recipientId', as: 'recipient' })
  Translocation.belongsTo(User, { ...noConstraint, foreignKey: 'recordedBy', as: 'recorder' })
  Proposal.hasMany(MonitoringObservation, { ...noConstraint, foreignKey: 'proposalId', as: 'observations' })
  MonitoringObservation.belongsTo(Proposal, { ...noConstraint, foreignKey: 'proposalId', as: 'proposal' })
  MonitoringObservation.belongsTo(User, { ...noConstraint, foreignKey: 'recordedBy', as: 'recorder' })
}
