/**
 * The tables of monitoring after approval (migration 0007) refuse bad rows themselves:
 * translocations need 1–500 animals shaped { id: text, sex: female | male | unknown }, a named
 * source that is not the recipient; follow-up observations need at least one figure in range
 * and a source. Statements are plain SQL, so the model layer cannot be what refused them.
 */
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createMigratedDatabase, expectRefused, SQLSTATE, type MigratedDatabase } from './helpers'

let db: MigratedDatabase
let ids: { agency: number, user: number, recipient: number, source: number, proposal: number }

async function one(sql: string, replacements: Record<string, unknown> = {}): Promise<number> {
  const [row] = await db.sequelize.query<{ id: number }>(sql, { replacements, type: QueryTypes.SELECT })
  if (!row) throw new Error(`no row from ${sql}`)
  return row.id
}

beforeAll(async () => {
  db = await createMigratedDatabase()
  const agency = await one(`INSERT INTO agencies (name, short_name) VALUES ('Monitoring Agency', 'MA') RETURNING id`)
  const user = await one(`INSERT INTO users (agency_id, email, name, role) VALUES (:agency, 'm@example.test', 'M', 'biologist') RETURNING id`, { agency })
  const species = await one(`INSERT INTO species (agency_id, common_name, scientific_name) VALUES (:agency, 'Newt', 'Newtus testus') RETURNING id`, { agency })
  const recipient = await one(`INSERT INTO subpopulations (agency_id, species_id, name, generation_time_years) VALUES (:agency, :species, 'Recipient', 3) RETURNING id`, { agency, species })
  const source = await one(`INSERT INTO subpopulations (agency_id, species_id, name, generation_time_years) VALUES (:agency, :species, 'Source', 3) RETURNING id`, { agency, species })
  const proposal = await one(`INSERT INTO proposals (agency_id, recipient_id, title, author_id) VALUES (:agency, :recipient, 'P', :user) RETURNING id`, { agency, recipient, user })
  ids = { agency, user, recipient, source, proposal }
})

afterAll(async () => {
  await db?.dispose()
})

const translocation = (values: { animals?: string, sourceId?: number | null, sourceNote?: string, recipientId?: number, movedOn?: string }) => db.sequelize.query(
  `INSERT INTO translocations (proposal_id, moved_on, source_id, source_note, recipient_id, animals, recorded_by)
   VALUES (:proposal, :movedOn, :sourceId, :sourceNote, :recipientId, CAST(:animals AS jsonb), :user)`,
  { replacements: {
    proposal: ids.proposal, user: ids.user, movedOn: values.movedOn ?? '2025-04-01',
    sourceId: values.sourceId === undefined ? ids.source : values.sourceId, sourceNote: values.sourceNote ?? '',
    recipientId: values.recipientId ?? ids.recipient, animals: values.animals ?? '[{"id":"A1","sex":"female"}]',
  } },
)

describe('translocations', () => {
  it('accepts a well-formed move, and a captive source named in words', async () => {
    await translocation({})
    await translocation({ sourceId: null, sourceNote: 'Zoo colony', animals: '[{"id":"Z1","sex":"unknown"},{"id":"Z2","sex":"male"}]' })
  })

  it('refuses malformed animal lists', async () => {
    for (const animals of ['[]', '{}', '[{"id":"A","sex":"juvenile"}]', '[{"id":7,"sex":"male"}]', '[{"sex":"male"}]', '[{"id":"A"}]']) {
      const constraint = animals === '[]' || animals === '{}' ? 'translocations_animals_list' : 'translocations_animals_shape'
      await expectRefused(translocation({ animals }), SQLSTATE.checkViolation, constraint)
    }
    const tooMany = JSON.stringify(Array.from({ length: 501 }, (_, index) => ({ id: `A${index}`, sex: 'male' })))
    await expectRefused(translocation({ animals: tooMany }), SQLSTATE.checkViolation, 'translocations_animals_list')
  })

  it('refuses an unnamed source, the recipient as its own source, and impossible days', async () => {
    await expectRefused(translocation({ sourceId: null, sourceNote: '  ' }), SQLSTATE.checkViolation, 'translocations_source_named')
    await expectRefused(translocation({ sourceId: ids.recipient }), SQLSTATE.checkViolation, 'translocations_source_not_recipient')
    await expectRefused(translocation({ movedOn: '1850-01-01' }), SQLSTATE.checkViolation, 'translocations_moved_on_range')
    await expectRefused(translocation({ recipientId: 999_999 }), SQLSTATE.foreignKeyViolation)
  })
})

const observation = (values: Record<string, unknown>) => db.sequelize.query(
  `INSERT INTO monitoring_observations (proposal_id, subpopulation_id, observed_on, census, heterozygosity, inbreeding, source, recorded_by)
   VALUES (:proposal, :recipient, '2025-05-01', :census, :heterozygosity, :inbreeding, :source, :user)`,
  { replacements: { proposal: ids.proposal, recipient: ids.recipient, user: ids.user, census: null, heterozygosity: null, inbreeding: null, source: 'Survey', ...values } },
)

describe('monitoring_observations', () => {
  it('accepts any one figure in range', async () => {
    await observation({ census: 0 })
    await observation({ heterozygosity: 1 })
    await observation({ inbreeding: -0.05 })
  })

  it('refuses rows without a figure, out of range or without a source', async () => {
    await expectRefused(observation({}), SQLSTATE.checkViolation, 'monitoring_observations_has_a_figure')
    await expectRefused(observation({ census: -1 }), SQLSTATE.checkViolation, 'monitoring_observations_census_non_negative')
    await expectRefused(observation({ heterozygosity: 1.01 }), SQLSTATE.checkViolation, 'monitoring_observations_heterozygosity_range')
    await expectRefused(observation({ inbreeding: 1 }), SQLSTATE.checkViolation, 'monitoring_observations_inbreeding_range')
    await expectRefused(observation({ census: 3, source: ' ' }), SQLSTATE.checkViolation, 'monitoring_observations_source_not_blank')
  })

  it('goes with its proposal (CASCADE) but keeps its recorder (NO ACTION)', async () => {
    await expectRefused(db.sequelize.query('DELETE FROM users WHERE id = :user', { replacements: { user: ids.user } }), SQLSTATE.foreignKeyViolation)
    await db.sequelize.query('DELETE FROM proposals WHERE id = :proposal', { replacements: { proposal: ids.proposal } })
    const [row] = await db.sequelize.query<{ n: number }>('SELECT (SELECT count(*) FROM translocations) + (SELECT count(*) FROM monitoring_observations) AS n', { type: QueryTypes.SELECT })
    expect(Number(row?.n)).toBe(0)
  })
})
