/**
 * Closed vocabularies of the data model: the one list each of the database CHECK constraints
 * (server/db/migrations/0001-foundation.ts), the Sequelize models (server/db/models/*), the zod
 * schemas (shared/schemas/*) and the UI read from.
 *
 * Adding a value here is not enough: the matching CHECK constraint must change in a new
 * migration too (a test in tests/db/constraints.test.ts compares the two).
 */

/** Roles of a user inside an agency, from most to least powerful. */
export const ROLES = ['administrator', 'manager', 'biologist', 'viewer'] as const
export type Role = typeof ROLES[number]

/** Why a one-time e-mailed token was issued. */
export const TOKEN_PURPOSES = ['invite', 'reset'] as const
export type TokenPurpose = typeof TOKEN_PURPOSES[number]

/**
 * Life cycle of a proposal: draft → submitted → approved / returned / declined; an author may
 * withdraw a draft or a submitted proposal. Approved proposals are frozen.
 */
export const PROPOSAL_STATUSES = ['draft', 'submitted', 'approved', 'returned', 'declined', 'withdrawn'] as const
export type ProposalStatus = typeof PROPOSAL_STATUSES[number]

/** What a manager decides on a submitted proposal. */
export const DECISION_KINDS = ['approve', 'return', 'decline'] as const
export type DecisionKind = typeof DECISION_KINDS[number]

/** File formats accepted for genotype tables. */
export const GENETIC_DATASET_FORMATS = ['csv', 'vcf'] as const
export type GeneticDatasetFormat = typeof GENETIC_DATASET_FORMATS[number]

/** Kinds of genetic marker a genotype table holds. */
export const MARKER_TYPES = ['microsatellite', 'snp'] as const
export type MarkerType = typeof MARKER_TYPES[number]

/** Delivery states of a queued e-mail. */
export const OUTBOX_STATUSES = ['queued', 'sending', 'sent', 'failed'] as const
export type OutboxStatus = typeof OUTBOX_STATUSES[number]

/** Records a file can be attached to (attachments.owner_type). */
export const ATTACHMENT_OWNER_TYPES = ['agency', 'species', 'subpopulation', 'proposal'] as const
export type AttachmentOwnerType = typeof ATTACHMENT_OWNER_TYPES[number]

/**
 * Geometry types a subpopulation boundary may have (GeoJSON `type`): a polygon or several,
 * or a point when only a location is known.
 */
export const SUBPOPULATION_GEOMETRY_TYPES = ['Polygon', 'MultiPolygon', 'Point'] as const
export type SubpopulationGeometryType = typeof SUBPOPULATION_GEOMETRY_TYPES[number]

/**
 * Known methods of an effective-size estimate (effective_size_estimates.method). The column is
 * free text so that an agency can record a method not listed here; these are the ones the app
 * computes or offers in its forms (SCIENCE.md, effective size).
 */
export const EFFECTIVE_SIZE_METHODS = [
  'sex-ratio',
  'harmonic-mean',
  'family-size-variance',
  'ne-n-ratio',
  'linkage-disequilibrium',
  'temporal',
  'heterozygote-excess',
  'other',
] as const
export type EffectiveSizeMethod = typeof EFFECTIVE_SIZE_METHODS[number]
