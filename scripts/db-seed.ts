/**
 * Applies pending migrations, then the demo seeds: `npm run db:seed` (tsx scripts/db-seed.ts).
 * Reads NUXT_DATABASE_URL (default: the local server of scripts/pg.sh). Prints one line;
 * exits 1 with a readable message when the database cannot be reached or a step fails.
 * Safe to run repeatedly: applied seeds are recorded and never run twice.
 */
import { runCli } from '../server/db/cli'
import { runMigrations } from '../server/db/migrate'
import { runSeeds } from '../server/db/seed'

await runCli('seed', async (sequelize, where) => {
  const migrated = await runMigrations(sequelize)
  const { applied } = await runSeeds(sequelize)
  const migrations = migrated.applied.length > 0 ? `applied migrations ${migrated.applied.join(', ')}; ` : ''
  return applied.length > 0
    ? `Seeded ${where}: ${migrations}applied ${applied.length} seed(s) (${applied.join(', ')}).`
    : `Seeded ${where}: ${migrations}demo data already present.`
})
