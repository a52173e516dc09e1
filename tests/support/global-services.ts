/**
 * Vitest global setup for the db, api and browser projects: makes sure the local
 * PostgreSQL runs, builds the app when no build exists, and prepares the migrated,
 * seeded template database that each test file copies.
 */
import { execFileSync } from 'node:child_process'
import { existsSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { createDb } from '../../server/db/connection'
import { runMigrations } from '../../server/db/migrate'
import { runSeeds } from '../../server/db/seed'
import { dropDatabase } from './db'
import { databaseUrl } from './env'
import pg from 'pg'
import type { TestProject } from 'vitest/node'

declare module 'vitest' {
  export interface ProvidedContext { templateDatabase: string }
}

const root = fileURLToPath(new URL('../..', import.meta.url))

export default async function setup(project: TestProject) {
  execFileSync('bash', ['scripts/pg.sh', 'start'], { cwd: root, stdio: 'inherit' })
  if (project.name === 'db') return
  // One template per project and run, so projects and parallel runs never share (or drop) each other's.
  const templateDatabase = `tributary_template_${project.name}_${process.pid}`
  project.provide('templateDatabase', templateDatabase)
  if (!existsSync(`${root}.output/server/index.mjs`)) {
    execFileSync('npx', ['nuxt', 'build'], { cwd: root, stdio: 'inherit' })
  }
  await dropDatabase(templateDatabase)
  const admin = new pg.Client({ connectionString: databaseUrl('postgres') })
  await admin.connect()
  await admin.query(`CREATE DATABASE "${templateDatabase}"`)
  await admin.end()
  const db = createDb(databaseUrl(templateDatabase))
  await runMigrations(db.sequelize)
  await runSeeds(db.sequelize)
  await db.sequelize.close()
  return async () => {
    await dropDatabase(templateDatabase)
  }
}
