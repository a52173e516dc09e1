/**
 * The database itself refuses bad rows: CHECK constraints, foreign keys, unique indexes and
 * the append-only audit trigger. Statements are plain SQL, so nothing in the model layer
 * can be what refused them.
 */
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import {
  ATTACHMENT_OWNER_TYPES, DECISION_KINDS, GENETIC_DATASET_FORMATS, MARKER_TYPES, OUTBOX_STATUSES,
  PROPOSAL_STATUSES, ROLES, SUBPOPULATION_GEOMETRY_TYPES, TOKEN_PURPOSES,
} from '../../shared/types/db'
import { createMigratedDatabase, expectRefused, SQLSTATE, type MigratedDatabase } from './helpers'

const HASH = 'a'.repeat(64)

let db: MigratedDatabase
let agencyId: number
let userId: number
let speciesId: number
let subpopulationId: number
let otherSubpopulationId: number

/** Runs a statement with named replacements and returns the first row (for INSERT … RETURNING). */
async function row<T extends object = { id: number }>(sql: string, replacements: Record<string, unknown> = {}): Promise<T> {
  const rows = await db.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT })
  const [first] = rows
  if (!first) throw new Error(`no row from: ${sql}`)
  return first
}

function run(sql: string, replacements: Record<string, unknown> = {}): Promise<unknown> {
  return db.sequelize.query(sql, { replacements })
}

async function newProposal(values: Record<string, unknown> = {}): Promise<number> {
  const columns = { agency_id: agencyId, recipient_id: subpopulationId, title: 'Test proposal', author_id: userId, ...values }
  const names = Object.keys(columns)
  const { id } = await row(
    `INSERT INTO proposals (${names.join(', ')}) VALUES (${names.map(name => Array.isArray(columns[name as keyof typeof columns]) ? `ARRAY[:${name}]::integer[]` : `:${name}`).join(', ')}) RETURNING id`,
    columns,
  )
  return id
}

beforeAll(async () => {
  db = await createMigratedDatabase()
  agencyId = (await row(`INSERT INTO agencies (name, short_name) VALUES ('Test Agency', 'TA') RETURNING id`)).id
  userId = (await row(`INSERT INTO users (agency_id, email, name, role) VALUES (:agencyId, 'author@example.test', 'Author', 'biologist') RETURNING id`, { agencyId })).id
  speciesId = (await row(`INSERT INTO species (agency_id, common_name, scientific_name) VALUES (:agencyId, 'Test newt', 'Testus newtus') RETURNING id`, { agencyId })).id
  subpopulationId = (await row(`INSERT INTO subpopulations (agency_id, species_id, name, generation_time_years) VALUES (:agencyId, :speciesId, 'North', 3) RETURNING id`, { agencyId, speciesId })).id
  otherSubpopulationId = (await row(`INSERT INTO subpopulations (agency_id, species_id, name, generation_time_years) VALUES (:agencyId, :speciesId, 'South', 3) RETURNING id`, { agencyId, speciesId })).id
})

afterAll(async () => {
  await db?.dispose()
})

describe('census_counts', () => {
  const insert = (values: { year: number, adults: number, males?: number | null, females?: number | null }) => run(
    `INSERT INTO census_counts (subpopulation_id, year, adults, males, females) VALUES (:subpopulationId, :year, :adults, :males, :females)`,
    { subpopulationId, males: null, females: null, ...values },
  )

  it('accepts counts within the invariants', async () => {
    await insert({ year: 2001, adults: 10, males: 4, females: 6 })
    await insert({ year: 2002, adults: 10, males: 3, females: 5 })
    await insert({ year: 2003, adults: 10, males: 10 })
    await insert({ year: 2004, adults: 0 })
  })

  it('refuses negative counts', async () => {
    await expectRefused(insert({ year: 2010, adults: -1 }), SQLSTATE.checkViolation, 'census_counts_adults_non_negative')
    await expectRefused(insert({ year: 2010, adults: 5, males: -1 }), SQLSTATE.checkViolation, 'census_counts_males_non_negative')
    await expectRefused(insert({ year: 2010, adults: 5, females: -2 }), SQLSTATE.checkViolation, 'census_counts_females_non_negative')
  })

  it('refuses males + females above adults, and either alone above adults', async () => {
    await expectRefused(insert({ year: 2010, adults: 10, males: 6, females: 5 }), SQLSTATE.checkViolation, 'census_counts_sexes_within_adults')
    await expectRefused(insert({ year: 2010, adults: 10, males: 11 }), SQLSTATE.checkViolation, 'census_counts_males_within_adults')
    await expectRefused(insert({ year: 2010, adults: 10, females: 11 }), SQLSTATE.checkViolation, 'census_counts_females_within_adults')
  })

  it('refuses implausible years and a second count for the same year', async () => {
    await expectRefused(insert({ year: 1700, adults: 1 }), SQLSTATE.checkViolation, 'census_counts_year_range')
    await expectRefused(insert({ year: 2001, adults: 1 }), SQLSTATE.uniqueViolation, 'census_counts_one_per_year')
  })

  it('refuses a count for a subpopulation that does not exist', async () => {
    await expectRefused(
      run(`INSERT INTO census_counts (subpopulation_id, year, adults) VALUES (999999, 2000, 1)`),
      SQLSTATE.foreignKeyViolation, 'census_counts_subpopulation_id_fkey',
    )
  })
})

describe('users', () => {
  const insert = (email: string, role = 'viewer', agency: number = agencyId) => run(
    `INSERT INTO users (agency_id, email, name, role) VALUES (:agency, :email, 'Someone', :role)`, { agency, email, role },
  )

  it('refuses an unknown role', async () => {
    await expectRefused(insert('role@example.test', 'superuser'), SQLSTATE.checkViolation, 'users_role_known')
    await expectRefused(insert('role@example.test', 'Administrator'), SQLSTATE.checkViolation, 'users_role_known')
  })

  it('refuses an e-mail address that is not stored lower-cased and trimmed, or has no @', async () => {
    await expectRefused(insert('Mixed@Example.test'), SQLSTATE.checkViolation, 'users_email_normalised')
    await expectRefused(insert(' padded@example.test'), SQLSTATE.checkViolation, 'users_email_normalised')
    await expectRefused(insert('no-at-sign'), SQLSTATE.checkViolation, 'users_email_shape')
  })

  it('keeps e-mail addresses unique regardless of case, through the model too', async () => {
    await insert('unique@example.test')
    await expectRefused(insert('unique@example.test'), SQLSTATE.uniqueViolation, 'users_email_unique')
    const attempt = db.models.User.create({
      agencyId, email: '  UNIQUE@Example.TEST ', name: 'Twin', role: 'viewer', passwordHash: null, lastSignInAt: null, invitedAt: null,
    })
    await expectRefused(attempt, SQLSTATE.uniqueViolation, 'users_email_unique')
  })

  it('stores an address given in capitals as lower case', async () => {
    const user = await db.models.User.create({
      agencyId, email: 'Capital@Example.TEST', name: 'Cap', role: 'viewer', passwordHash: null, lastSignInAt: null, invitedAt: null,
    })
    const stored = await row<{ email: string }>(`SELECT email FROM users WHERE id = :id`, { id: user.id })
    expect(stored.email).toBe('capital@example.test')
  })

  it('refuses a user of an agency that does not exist', async () => {
    await expectRefused(insert('ghost@example.test', 'viewer', 999999), SQLSTATE.foreignKeyViolation, 'users_agency_id_fkey')
  })
})

describe('user_tokens and sign_in_attempts', () => {
  it('refuses an unknown purpose, a hash that is not SHA-256 hex, and a reused hash', async () => {
    const insert = (purpose: string, hash: string) => run(
      `INSERT INTO user_tokens (user_id, purpose, token_hash, expires_at) VALUES (:userId, :purpose, :hash, now() + interval '1 day')`,
      { userId, purpose, hash },
    )
    await insert('invite', HASH)
    await expectRefused(insert('login', 'b'.repeat(64)), SQLSTATE.checkViolation, 'user_tokens_purpose_known')
    await expectRefused(insert('reset', 'not-a-hash'), SQLSTATE.checkViolation, 'user_tokens_token_hash_sha256')
    await expectRefused(insert('reset', 'A'.repeat(64)), SQLSTATE.checkViolation, 'user_tokens_token_hash_sha256')
    await expectRefused(insert('reset', HASH), SQLSTATE.uniqueViolation, 'user_tokens_token_hash_unique')
  })

  it('refuses a blank rate-limit key', async () => {
    await expectRefused(run(`INSERT INTO sign_in_attempts (key, succeeded) VALUES ('  ', false)`), SQLSTATE.checkViolation, 'sign_in_attempts_key_not_blank')
  })
})

describe('subpopulations', () => {
  const insert = (values: Record<string, unknown> & { name: string }) => {
    const columns: Record<string, unknown> = { agency_id: agencyId, species_id: speciesId, generation_time_years: 2, ...values }
    const names = Object.keys(columns)
    return run(`INSERT INTO subpopulations (${names.join(', ')}) VALUES (${names.map(name => name === 'geometry' ? `CAST(:${name} AS jsonb)` : `:${name}`).join(', ')})`, columns)
  }

  it('refuses a non-positive generation time and negative area or isolation', async () => {
    await expectRefused(insert({ name: 'g0', generation_time_years: 0 }), SQLSTATE.checkViolation, 'subpopulations_generation_time_positive')
    await expectRefused(insert({ name: 'a', area_km2: -1 }), SQLSTATE.checkViolation, 'subpopulations_area_non_negative')
    await expectRefused(insert({ name: 'y', years_isolated: -3 }), SQLSTATE.checkViolation, 'subpopulations_years_isolated_non_negative')
  })

  it('refuses a working Ne without a reason, or not positive', async () => {
    await expectRefused(insert({ name: 'w1', working_ne: 40 }), SQLSTATE.checkViolation, 'subpopulations_working_ne_has_reason')
    await expectRefused(insert({ name: 'w2', working_ne: 40, working_ne_reason: '  ' }), SQLSTATE.checkViolation, 'subpopulations_working_ne_has_reason')
    await expectRefused(insert({ name: 'w3', working_ne: 0, working_ne_reason: 'x' }), SQLSTATE.checkViolation, 'subpopulations_working_ne_positive')
    await insert({ name: 'w4', working_ne: 40, working_ne_reason: 'sex-ratio estimate' })
  })

  it('refuses half a centroid and coordinates out of range', async () => {
    await expectRefused(insert({ name: 'c1', centroid_lon: -82 }), SQLSTATE.checkViolation, 'subpopulations_centroid_pair')
    await expectRefused(insert({ name: 'c2', centroid_lon: -182, centroid_lat: 35 }), SQLSTATE.checkViolation, 'subpopulations_centroid_lon_range')
  })

  it('refuses a geometry that is not a polygon, multipolygon or point', async () => {
    const line = JSON.stringify({ type: 'LineString', coordinates: [[0, 0], [1, 1]] })
    await expectRefused(insert({ name: 'l', geometry: line }), SQLSTATE.checkViolation, 'subpopulations_geometry_type')
    await expectRefused(insert({ name: 'l2', geometry: JSON.stringify({ type: 'Point' }) }), SQLSTATE.checkViolation, 'subpopulations_geometry_type')
    await expectRefused(insert({ name: 'l3', geometry: JSON.stringify('Polygon') }), SQLSTATE.checkViolation, 'subpopulations_geometry_type')
    await insert({ name: 'p', geometry: JSON.stringify({ type: 'Point', coordinates: [-82, 35] }) })
  })

  it('refuses two subpopulations of one species with the same name in any case', async () => {
    await expectRefused(insert({ name: 'NORTH' }), SQLSTATE.uniqueViolation, 'subpopulations_species_name_unique')
  })

  it('refuses a species that does not exist, and deleting a species that has subpopulations', async () => {
    await expectRefused(insert({ name: 'orphan', species_id: 999999 }), SQLSTATE.foreignKeyViolation, 'subpopulations_species_id_fkey')
    await expectRefused(run(`DELETE FROM species WHERE id = :speciesId`, { speciesId }), SQLSTATE.foreignKeyViolation, 'subpopulations_species_id_fkey')
  })
})

describe('effective_size_estimates', () => {
  const insert = (values: Record<string, unknown>) => run(
    `INSERT INTO effective_size_estimates (subpopulation_id, method, value, interval_low, interval_high, source)
     VALUES (:subpopulationId, 'sex-ratio', :value, :low, :high, :source)`,
    { subpopulationId, low: null, high: null, source: 'field report', ...values },
  )

  it('accepts an estimate with an interval, including an infinite upper bound', async () => {
    await insert({ value: 50, low: 20, high: 120 })
    await insert({ value: 50, low: 20, high: 'Infinity' })
  })

  it('refuses a non-positive value, an interval that excludes it, and a blank source', async () => {
    await expectRefused(insert({ value: 0 }), SQLSTATE.checkViolation, 'effective_size_estimates_value_positive')
    await expectRefused(insert({ value: -5 }), SQLSTATE.checkViolation, 'effective_size_estimates_value_positive')
    await expectRefused(insert({ value: 50, low: 60 }), SQLSTATE.checkViolation, 'effective_size_estimates_interval_low_le_value')
    await expectRefused(insert({ value: 50, high: 40 }), SQLSTATE.checkViolation, 'effective_size_estimates_interval_high_ge_value')
    await expectRefused(insert({ value: 50, low: -1 }), SQLSTATE.checkViolation, 'effective_size_estimates_interval_low_non_negative')
    await expectRefused(insert({ value: 50, source: ' ' }), SQLSTATE.checkViolation, 'effective_size_estimates_source_not_blank')
  })
})

describe('genetic_datasets and attachments', () => {
  const dataset = (values: Record<string, unknown>) => run(
    `INSERT INTO genetic_datasets (subpopulation_id, storage_key, file_name, format, marker_type, size_bytes, checksum_sha256)
     VALUES (:subpopulationId, :key, 'g.csv', :format, :marker, :size, :checksum)`,
    { subpopulationId, key: `k-${Math.random()}`, format: 'csv', marker: 'snp', size: 10, checksum: HASH, ...values },
  )
  const attachment = (values: Record<string, unknown>) => run(
    `INSERT INTO attachments (agency_id, owner_type, owner_id, storage_key, file_name, content_type, size_bytes, checksum_sha256)
     VALUES (:agencyId, :ownerType, :ownerId, :key, 'permit.pdf', 'application/pdf', :size, :checksum)`,
    { agencyId, ownerType: 'subpopulation', ownerId: subpopulationId, key: `a-${Math.random()}`, size: 10, checksum: HASH, ...values },
  )

  it('refuses unknown formats and marker types, negative sizes and malformed checksums', async () => {
    await dataset({})
    await expectRefused(dataset({ format: 'xlsx' }), SQLSTATE.checkViolation, 'genetic_datasets_format_known')
    await expectRefused(dataset({ marker: 'aflp' }), SQLSTATE.checkViolation, 'genetic_datasets_marker_type_known')
    await expectRefused(dataset({ size: -1 }), SQLSTATE.checkViolation, 'genetic_datasets_size_non_negative')
    await expectRefused(dataset({ checksum: 'xyz' }), SQLSTATE.checkViolation, 'genetic_datasets_checksum_sha256')
  })

  it('refuses an attachment with a negative size, an unknown owner type or a reused storage key', async () => {
    await attachment({ key: 'same-key' })
    await expectRefused(attachment({ size: -10 }), SQLSTATE.checkViolation, 'attachments_size_non_negative')
    await expectRefused(attachment({ ownerType: 'planet' }), SQLSTATE.checkViolation, 'attachments_owner_type_known')
    await expectRefused(attachment({ key: 'same-key' }), SQLSTATE.uniqueViolation, 'attachments_storage_key_unique')
  })

  it('reads BIGINT sizes back as numbers through the models', async () => {
    const created = await db.models.Attachment.create({
      agencyId, ownerType: 'agency', ownerId: agencyId, storageKey: 'big-file', fileName: 'big.tif', contentType: 'image/tiff',
      sizeBytes: 5_000_000_000, checksumSha256: HASH, uploadedBy: null,
    })
    const loaded = await db.models.Attachment.findByPk(created.id)
    expect(loaded?.sizeBytes).toBe(5_000_000_000)
  })
})

describe('proposals, scenarios, decisions, comments', () => {
  it('refuses an unknown status', async () => {
    await expectRefused(newProposal({ status: 'archived' }), SQLSTATE.checkViolation, 'proposals_status_known')
    await expectRefused(newProposal({ status: 'Draft' }), SQLSTATE.checkViolation, 'proposals_status_known')
  })

  it('refuses a submitted proposal without a submission time and a decided one without a decision time', async () => {
    await expectRefused(newProposal({ status: 'submitted' }), SQLSTATE.checkViolation, 'proposals_submitted_at_set')
    await expectRefused(newProposal({ status: 'approved', submitted_at: new Date() }), SQLSTATE.checkViolation, 'proposals_decided_at_set')
    await newProposal({ status: 'approved', submitted_at: new Date(), decided_at: new Date() })
    await newProposal({ status: 'withdrawn' })
  })

  it('refuses the recipient as one of its own sources', async () => {
    await expectRefused(
      newProposal({ source_subpopulation_ids: [otherSubpopulationId, subpopulationId] }),
      SQLSTATE.checkViolation, 'proposals_recipient_not_a_source',
    )
    await newProposal({ source_subpopulation_ids: [otherSubpopulationId] })
  })

  it('refuses a recipient or author that does not exist', async () => {
    await expectRefused(newProposal({ recipient_id: 999999 }), SQLSTATE.foreignKeyViolation, 'proposals_recipient_id_fkey')
    await expectRefused(newProposal({ author_id: 999999 }), SQLSTATE.foreignKeyViolation, 'proposals_author_id_fkey')
  })

  it('refuses deleting a user who authored a proposal', async () => {
    await expectRefused(run(`DELETE FROM users WHERE id = :userId`, { userId }), SQLSTATE.foreignKeyViolation, 'proposals_author_id_fkey')
  })

  it('allows one baseline scenario per proposal', async () => {
    const proposalId = await newProposal()
    await run(`INSERT INTO scenarios (proposal_id, name, is_baseline) VALUES (:proposalId, 'Do nothing', true)`, { proposalId })
    await run(`INSERT INTO scenarios (proposal_id, name, is_baseline) VALUES (:proposalId, 'Move four', false)`, { proposalId })
    await expectRefused(
      run(`INSERT INTO scenarios (proposal_id, name, is_baseline) VALUES (:proposalId, 'Second baseline', true)`, { proposalId }),
      SQLSTATE.uniqueViolation, 'scenarios_one_baseline_per_proposal',
    )
  })

  it('refuses recommending a scenario of another proposal; deleting the recommended one clears the choice', async () => {
    const first = await newProposal()
    const second = await newProposal()
    const own = (await row(`INSERT INTO scenarios (proposal_id, name) VALUES (:first, 'Own') RETURNING id`, { first })).id
    const foreign = (await row(`INSERT INTO scenarios (proposal_id, name) VALUES (:second, 'Foreign') RETURNING id`, { second })).id
    await expectRefused(
      run(`UPDATE proposals SET recommended_scenario_id = :foreign WHERE id = :first`, { foreign, first }),
      SQLSTATE.foreignKeyViolation, 'proposals_recommended_scenario_fkey',
    )
    await run(`UPDATE proposals SET recommended_scenario_id = :own WHERE id = :first`, { own, first })
    await run(`DELETE FROM scenarios WHERE id = :own`, { own })
    const after = await row<{ id: number, recommended_scenario_id: number | null }>(`SELECT id, recommended_scenario_id FROM proposals WHERE id = :first`, { first })
    expect(after).toEqual({ id: first, recommended_scenario_id: null })
  })

  it('deletes a proposal together with its scenarios, even one that is recommended', async () => {
    const proposalId = await newProposal()
    const scenarioId = (await row(`INSERT INTO scenarios (proposal_id, name) VALUES (:proposalId, 'Chosen') RETURNING id`, { proposalId })).id
    await run(`UPDATE proposals SET recommended_scenario_id = :scenarioId WHERE id = :proposalId`, { scenarioId, proposalId })
    await run(`DELETE FROM proposals WHERE id = :proposalId`, { proposalId })
    const left = await row<{ n: string }>(`SELECT count(*) AS n FROM scenarios WHERE proposal_id = :proposalId`, { proposalId })
    expect(Number(left.n)).toBe(0)
  })

  it('refuses a proposal revising itself', async () => {
    const proposalId = await newProposal()
    await expectRefused(run(`UPDATE proposals SET revises_id = id WHERE id = :proposalId`, { proposalId }), SQLSTATE.checkViolation, 'proposals_not_revising_itself')
  })

  it('refuses an unknown decision, and a return or decline without a reason', async () => {
    const proposalId = await newProposal()
    const decide = (decision: string, comment: string) => run(
      `INSERT INTO decisions (proposal_id, decided_by, decision, comment) VALUES (:proposalId, :userId, :decision, :comment)`,
      { proposalId, userId, decision, comment },
    )
    await expectRefused(decide('approved', 'ok'), SQLSTATE.checkViolation, 'decisions_decision_known')
    await expectRefused(decide('return', '   '), SQLSTATE.checkViolation, 'decisions_reason_given')
    await expectRefused(decide('decline', ''), SQLSTATE.checkViolation, 'decisions_reason_given')
    await decide('approve', '')
    await decide('return', 'Please add a monitoring plan.')
  })

  it('refuses a blank comment and mentions that are not a list', async () => {
    const proposalId = await newProposal()
    const comment = (body: string, mentions: string) => run(
      `INSERT INTO comments (proposal_id, author_id, body, mentions) VALUES (:proposalId, :userId, :body, CAST(:mentions AS jsonb))`,
      { proposalId, userId, body, mentions },
    )
    await comment('Looks good', '[1]')
    await expectRefused(comment('  ', '[]'), SQLSTATE.checkViolation, 'comments_body_not_blank')
    await expectRefused(comment('Hi', '{"a":1}'), SQLSTATE.checkViolation, 'comments_mentions_array')
  })
})

describe('outbox_messages', () => {
  const insert = (values: Record<string, unknown>) => run(
    `INSERT INTO outbox_messages (to_address, subject, text_body, status, attempts, sent_at) VALUES ('a@example.test', 'S', 'T', :status, :attempts, :sentAt)`,
    { status: 'queued', attempts: 0, sentAt: null, ...values },
  )

  it('refuses an unknown status, negative attempts and "sent" without a time', async () => {
    await insert({})
    await expectRefused(insert({ status: 'bounced' }), SQLSTATE.checkViolation, 'outbox_messages_status_known')
    await expectRefused(insert({ attempts: -1 }), SQLSTATE.checkViolation, 'outbox_messages_attempts_non_negative')
    await expectRefused(insert({ status: 'sent' }), SQLSTATE.checkViolation, 'outbox_messages_sent_at_set')
    await insert({ status: 'sent', sentAt: new Date() })
  })
})

describe('audit_events is append-only', () => {
  let eventId: number

  beforeAll(async () => {
    eventId = (await row(
      `INSERT INTO audit_events (agency_id, actor_id, action, entity_type, entity_id, after) VALUES (:agencyId, :userId, 'species.create', 'species', :speciesId, '{"name":"x"}') RETURNING id`,
      { agencyId, userId, speciesId },
    )).id
  })

  it('accepts inserts, also through the model', async () => {
    const event = await db.models.AuditEvent.create({ agencyId, actorId: null, action: 'system.check', entityType: 'agency', entityId: agencyId, before: null, after: null })
    expect(event.id).toBeGreaterThan(eventId)
  })

  it('refuses UPDATE', async () => {
    await expectRefused(run(`UPDATE audit_events SET action = 'tampered' WHERE id = :eventId`, { eventId }), SQLSTATE.insufficientPrivilege, /append-only: UPDATE/)
  })

  it('refuses DELETE, also through the model', async () => {
    await expectRefused(run(`DELETE FROM audit_events WHERE id = :eventId`, { eventId }), SQLSTATE.insufficientPrivilege, /append-only: DELETE/)
    await expectRefused(db.models.AuditEvent.destroy({ where: { id: eventId } }), SQLSTATE.insufficientPrivilege, /append-only: DELETE/)
  })

  it('refuses TRUNCATE', async () => {
    await expectRefused(run(`TRUNCATE audit_events`), SQLSTATE.insufficientPrivilege, /append-only: TRUNCATE/)
  })

  it('keeps the row unchanged after the refusals', async () => {
    const kept = await row<{ action: string }>(`SELECT action FROM audit_events WHERE id = :eventId`, { eventId })
    expect(kept.action).toBe('species.create')
  })

  it('refuses deleting an agency or a user that appears in the audit log', async () => {
    await expectRefused(run(`DELETE FROM agencies WHERE id = :agencyId`, { agencyId }), SQLSTATE.foreignKeyViolation)
    const auditedUser = (await row(`INSERT INTO users (agency_id, email, name, role) VALUES (:agencyId, 'audited@example.test', 'Audited', 'viewer') RETURNING id`, { agencyId })).id
    await run(`INSERT INTO audit_events (agency_id, actor_id, action, entity_type) VALUES (:agencyId, :auditedUser, 'user.sign-in', 'user')`, { agencyId, auditedUser })
    await expectRefused(run(`DELETE FROM users WHERE id = :auditedUser`, { auditedUser }), SQLSTATE.foreignKeyViolation, 'audit_events_actor_id_fkey')
  })
})

describe('deleting an agency without audit history', () => {
  it('takes everything it owns with it', async () => {
    const otherAgency = (await row(`INSERT INTO agencies (name, short_name) VALUES ('Short-lived Agency', 'SLA') RETURNING id`)).id
    const author = (await row(`INSERT INTO users (agency_id, email, name, role) VALUES (:otherAgency, 'short@example.test', 'Short', 'biologist') RETURNING id`, { otherAgency })).id
    const species = (await row(`INSERT INTO species (agency_id, common_name, scientific_name) VALUES (:otherAgency, 'Brief frog', 'Rana brevis') RETURNING id`, { otherAgency })).id
    const subpopulation = (await row(`INSERT INTO subpopulations (agency_id, species_id, name, generation_time_years) VALUES (:otherAgency, :species, 'Pond', 2) RETURNING id`, { otherAgency, species })).id
    await run(`INSERT INTO census_counts (subpopulation_id, year, adults) VALUES (:subpopulation, 2020, 12)`, { subpopulation })
    await run(`INSERT INTO proposals (agency_id, recipient_id, title, author_id) VALUES (:otherAgency, :subpopulation, 'P', :author)`, { otherAgency, subpopulation, author })
    await run(`DELETE FROM agencies WHERE id = :otherAgency`, { otherAgency })
    const counts = await row<{ users: string, subpopulations: string, census: string, proposals: string }>(
      `SELECT (SELECT count(*) FROM users WHERE agency_id = :otherAgency) AS users,
              (SELECT count(*) FROM subpopulations WHERE agency_id = :otherAgency) AS subpopulations,
              (SELECT count(*) FROM census_counts WHERE subpopulation_id = :subpopulation) AS census,
              (SELECT count(*) FROM proposals WHERE agency_id = :otherAgency) AS proposals`,
      { otherAgency, subpopulation },
    )
    expect(Object.values(counts).map(Number)).toEqual([0, 0, 0, 0])
  })
})

describe('closed vocabularies', () => {
  const cases: [string, readonly string[]][] = [
    ['users_role_known', ROLES],
    ['user_tokens_purpose_known', TOKEN_PURPOSES],
    ['proposals_status_known', PROPOSAL_STATUSES],
    ['decisions_decision_known', DECISION_KINDS],
    ['genetic_datasets_format_known', GENETIC_DATASET_FORMATS],
    ['genetic_datasets_marker_type_known', MARKER_TYPES],
    ['outbox_messages_status_known', OUTBOX_STATUSES],
    ['attachments_owner_type_known', ATTACHMENT_OWNER_TYPES],
    ['subpopulations_geometry_type', SUBPOPULATION_GEOMETRY_TYPES],
  ]

  it.each(cases)('%s allows exactly the values listed in shared/types/db.ts', async (constraint, values) => {
    const { definition } = await row<{ definition: string }>(
      `SELECT pg_get_constraintdef(oid) AS definition FROM pg_constraint WHERE conname = :constraint`, { constraint },
    )
    const quoted = [...definition.matchAll(/'([A-Za-z-]+)'::text/g)].map(match => match[1])
    // The geometry check also names JSON type words ('object', 'array'); keep only GeoJSON types there.
    const listed = constraint === 'subpopulations_geometry_type' ? quoted.filter(value => /^[A-Z]/.test(value ?? '')) : quoted
    expect([...listed].sort()).toEqual([...values].sort())
  })
})
