// GET /api/health — liveness and database reachability, for start scripts, tests and load balancers.
// 200 { ok: true } when a query goes through; 503 { ok: false, message } with Retry-After while the
// database cannot be reached (the same answer and message as every other route then).
import { DB_UNAVAILABLE_MESSAGE, isDbUnavailable } from '../db/connection'

export default defineEventHandler(async (event) => {
  try {
    const { sequelize } = await useDb()
    await sequelize.query('SELECT 1')
    return { ok: true, database: 'reachable' }
  } catch (error) {
    if (!isDbUnavailable(error)) console.error('[health] database check failed:', error)
    setResponseStatus(event, 503, 'Service Unavailable')
    setResponseHeader(event, 'retry-after', 5)
    setResponseHeader(event, 'cache-control', 'no-store')
    return { ok: false, database: 'unreachable', message: DB_UNAVAILABLE_MESSAGE }
  }
})
