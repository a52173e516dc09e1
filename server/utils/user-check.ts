/**
 * The check every signed-in request makes — is the user still active, in the same agency, on the
 * same session version? — together with the records' version, batched across requests.
 *
 * Requests that arrive while the server is busy with one turn of its event loop are checked by
 * one query (`WHERE id = ANY(...)`) started at the next turn (DataLoader with a setImmediate
 * schedule, no caching). The query always starts after every request it answers has arrived, so
 * each request still sees every change committed before it came in — a deactivation, a password
 * change, a write of its own sent just before — exactly as with one query per request; under load
 * one round trip to PostgreSQL serves many requests.
 *
 * The records' versions (migration 0009-data-version) are read in the same query, before
 * anything the route reads next; server/utils/read-cache.ts relies on that order.
 */
import DataLoader from 'dataloader'
import { QueryTypes } from 'sequelize'
import type { CurrentUser } from './auth'

/** What the check reads of one user (the session user's fields and more), with the records' version at that moment. */
export interface UserCheckRow extends CurrentUser {
  active: boolean
  hasPassword: boolean
  /** The records' version, table by table (migration 0009-data-version); shared by the rows of one batch, read-only. */
  dataVersions: Readonly<Record<string, number>>
}

type UserCheckQueryRow = Omit<UserCheckRow, 'dataVersions'> & { dataVersions: string }

/** Most users checked by one query. */
const MAX_BATCH = 256

const USER_CHECK_SQL = `
  SELECT u.id, u.agency_id AS "agencyId", u.email, u.name, u.role, u.session_version AS "sessionVersion", u.active,
         u.password_hash IS NOT NULL AS "hasPassword", v.versions::text AS "dataVersions"
    FROM users u CROSS JOIN (SELECT versions FROM data_version WHERE id = 1) v
   WHERE u.id = ANY(ARRAY[:ids]::integer[])`

async function checkUsers(ids: readonly number[]): Promise<(UserCheckRow | null)[]> {
  const { sequelize } = await useDb()
  const rows = await sequelize.query<UserCheckQueryRow>(USER_CHECK_SQL, { replacements: { ids: [...new Set(ids)] }, type: QueryTypes.SELECT })
  const versions = rows[0] ? Object.freeze(JSON.parse(rows[0].dataVersions) as Record<string, number>) : {}
  const byId = new Map(rows.map(row => [row.id, { ...row, dataVersions: versions }]))
  return ids.map(id => byId.get(id) ?? null)
}

const loader = new DataLoader<number, UserCheckRow | null>(checkUsers, {
  cache: false,
  maxBatchSize: MAX_BATCH,
  batchScheduleFn: callback => setImmediate(callback),
})

/**
 * The user row as it is now (null when there is no such user), and the records' version.
 *
 * @param id - the user id the session claims
 * @throws what the database throws (unreachable → the error handler's 503)
 */
export function checkUser(id: number): Promise<UserCheckRow | null> {
  return loader.load(id)
}
