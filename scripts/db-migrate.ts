/**
 * Applies pending database migrations: `npm run db:migrate` (tsx scripts/db-migrate.ts).
 * Reads NUXT_DATABASE_URL (default: the local server of scripts/pg.sh). Prints one line;
 * exits 1 with a readable message when the database cannot be reached or a migration fails.
 */
import { runCli } from '../server/db/cli'
import { runMigrations } from '../server/db/migrate'

await runCli('migrate', async (sequelize, where) => {
  const { applied } = await runMigrations(sequelize)
  return applied.length > 0
    ? `Migrated ${where}: applied ${applied.length} (${applied.join(', ')}).`
    : `Migrated ${where}: already up to date.`
})
