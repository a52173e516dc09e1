/**
 * Helpers for the security sweeps (csrf.test.ts, cross-agency.test.ts): every route file under
 * server/api read from disk (so a new route is swept without anyone adding it here), one record
 * of each kind in the demo agency to aim them at, and a fingerprint of the whole database to
 * prove that a refused request wrote nothing.
 */
import { readdirSync } from 'node:fs'
import { join, relative, sep } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { ApiClient } from '../support/client'
import type { TestServer } from '../support/server'
import { uploadForm } from './genotypes-support'
import { createProposal, demoRecords } from './proposals-support'
import { establishmentParameters } from './runs-support'

const apiFolder = fileURLToPath(new URL('../../server/api', import.meta.url))

/** One route file: its method and URL pattern with Nitro's [param] segments. */
export interface ApiRoute {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'
  /** e.g. '/api/proposals/[id]/comments' */
  pattern: string
  /** names of the [params] in the pattern, in order */
  params: string[]
}

const METHODS = new Set(['get', 'post', 'put', 'patch', 'delete'])

function filesUnder(folder: string): string[] {
  return readdirSync(folder, { withFileTypes: true }).flatMap(entry =>
    entry.isDirectory() ? filesUnder(join(folder, entry.name)) : [join(folder, entry.name)])
}

/**
 * Every route under server/api: `proposals/[id]/comments.post.ts` → POST /api/proposals/[id]/comments;
 * `index.get.ts` → the folder; `export.csv.get.ts` → `export.csv`.
 */
export function scanApiRoutes(): ApiRoute[] {
  const routes: ApiRoute[] = []
  for (const file of filesUnder(apiFolder)) {
    const path = relative(apiFolder, file).split(sep).join('/')
    const match = /^(.*)\.(get|post|put|patch|delete)\.ts$/.exec(path)
    if (!match || !METHODS.has(match[2]!)) continue
    const pattern = `/api/${match[1]!}`.replace(/\/index$/, '')
    const params = [...pattern.matchAll(/\[([^\]]+)\]/g)].map(m => m[1]!)
    routes.push({ method: match[2]!.toUpperCase() as ApiRoute['method'], pattern, params })
  }
  return routes.sort((a, b) => `${a.pattern} ${a.method}`.localeCompare(`${b.pattern} ${b.method}`))
}

/** Record ids of the demo agency, one per kind of record a route can name. */
export interface DemoIds {
  user: number
  species: number
  subpopulation: number
  census: number
  effectiveSize: number
  genotype: number
  attachment: number
  proposal: number
  proposalVersion: number
  scenario: number
  run: number
}

async function firstId(server: TestServer, sql: string, params: unknown[] = []): Promise<number> {
  const result = await server.db.query<{ id: number }>(sql, params)
  const row = result.rows[0]
  if (!row) throw new Error(`no demo record for: ${sql}`)
  return row.id
}

/**
 * One record of each kind in the demo agency. Seeded kinds are read from the database (the
 * proposal is the seeded approved one, which has versions, a decision and a signed brief); an
 * attachment, a draft proposal's scenario and a simulation run are made through the API by
 * `biologist` (a demo biologist's client).
 */
export async function demoIds(server: TestServer, biologist: ApiClient): Promise<DemoIds> {
  const agency = await firstId(server, `SELECT id FROM agencies WHERE name = 'Eastern Uplands Wildlife Service'`)
  const records = await demoRecords(server)
  const subpopulation = records.fernwhistle
  const upload = await uploadForm(biologist, `/api/subpopulations/${subpopulation}/attachments`, { name: 'survey-permit.pdf', content: '%PDF-1.4\n%%EOF\n' })
  if (upload.status !== 201) throw new Error(`attachment upload failed: ${upload.status} ${JSON.stringify(upload.body)}`)
  const created = await createProposal(biologist, { title: 'Isolation sweep', recipientId: records.owlfeather, purpose: 'Sweep.', sourceSubpopulationIds: [records.quillmoss] })
  const draft = created.proposal.id as number
  const scenario = (created.scenarios as { id: number, isBaseline: boolean }[]).find(s => !s.isBaseline)?.id ?? created.scenarios[0].id
  // The seeded approved proposal has saved versions, comments, a decision and a signed brief.
  const approvedRow = await server.db.query<{ id: number, version: number }>(
    `SELECT p.id, max(v.version) AS version FROM proposals p JOIN proposal_versions v ON v.proposal_id = p.id
     WHERE p.agency_id = $1 AND p.status = 'approved' GROUP BY p.id ORDER BY p.id LIMIT 1`, [agency])
  const approved = approvedRow.rows[0]
  if (!approved) throw new Error('no seeded approved proposal with versions')
  const run = await biologist.post('/api/runs', { proposalId: draft, scenarioId: scenario, model: 'establishment', parameters: establishmentParameters, seed: 7, replicates: 10 })
  if (run.status !== 202) throw new Error(`run request failed: ${run.status} ${JSON.stringify(run.body)}`)
  return {
    user: await firstId(server, 'SELECT id FROM users WHERE agency_id = $1 ORDER BY id', [agency]),
    species: await firstId(server, 'SELECT id FROM species WHERE agency_id = $1 ORDER BY id', [agency]),
    subpopulation,
    census: await firstId(server, 'SELECT id FROM census_counts WHERE subpopulation_id = $1 ORDER BY id', [subpopulation]),
    effectiveSize: await firstId(server, 'SELECT id FROM effective_size_estimates WHERE subpopulation_id = $1 ORDER BY id', [subpopulation]),
    genotype: await firstId(server, 'SELECT g.id FROM genetic_datasets g JOIN subpopulations s ON s.id = g.subpopulation_id WHERE s.agency_id = $1 ORDER BY g.id', [agency]),
    attachment: upload.body.id as number,
    proposal: approved.id,
    proposalVersion: approved.version,
    scenario,
    run: run.body.id as number,
  }
}

/**
 * The id a [param] stands for, from the folder it follows: `proposals/[id]` → a proposal,
 * `census/[censusId]` → a census row, `versions/[version]` → the proposal's version number.
 * Throws for a parameter nobody has taught it (a new kind of route: add it here).
 */
export function idFor(pattern: string, param: string, ids: DemoIds): number {
  const segment = pattern.split('/').findIndex(part => part === `[${param}]`)
  const folder = pattern.split('/')[segment - 1] ?? ''
  const byFolder: Record<string, number> = {
    'users': ids.user, 'species': ids.species, 'subpopulations': ids.subpopulation, 'census': ids.census,
    'effective-sizes': ids.effectiveSize, 'genotypes': ids.genotype, 'attachments': ids.attachment,
    'proposals': ids.proposal, 'versions': ids.proposalVersion, 'scenarios': ids.scenario, 'runs': ids.run,
  }
  const id = byFolder[folder]
  if (id === undefined) throw new Error(`${pattern}: no demo record for [${param}] after "${folder}/" — teach tests/api/security-support.ts idFor`)
  return id
}

/** The route's URL with each [param] replaced by `value(param)`. */
export function fillPattern(route: ApiRoute, value: (param: string) => number | string): string {
  return route.pattern.replace(/\[([^\]]+)\]/g, (_, param: string) => String(value(param)))
}

/**
 * A digest of every row of every table in the public schema, table by table. The outbox only
 * counts its rows (the mail dispatcher marks earlier messages sent in the background), and
 * sign-in attempts are left out where a sweep signs in on purpose (`skip`).
 */
export async function databaseFingerprint(server: TestServer, skip: string[] = []): Promise<Record<string, string>> {
  const tables = await server.db.query<{ name: string }>(
    `SELECT table_name AS name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY table_name`,
  )
  const fingerprint: Record<string, string> = {}
  for (const { name } of tables.rows) {
    if (skip.includes(name)) continue
    const sql = name === 'outbox_messages'
      ? 'SELECT count(*)::text AS digest FROM outbox_messages'
      : `SELECT md5(coalesce(string_agg(t::text, '|' ORDER BY t::text), '')) AS digest FROM "${name}" t`
    const result = await server.db.query<{ digest: string }>(sql)
    fingerprint[name] = result.rows[0]?.digest ?? ''
  }
  return fingerprint
}
