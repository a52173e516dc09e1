// GET /api/health — liveness and database reachability, for start scripts, tests and load balancers.
export default defineEventHandler(async (event) => {
  try {
    const { sequelize } = await useDb()
    await sequelize.query('SELECT 1')
    return { ok: true, database: 'reachable' }
  } catch {
    setResponseStatus(event, 503)
    return { ok: false, database: 'unreachable', message: 'The database is not reachable right now; try again in a moment.' }
  }
})
