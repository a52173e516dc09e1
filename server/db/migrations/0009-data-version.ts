/**
 * Versions of the records, table by table, so the server can keep answers to frequent reads in
 * memory and still never hand out an old one (server/utils/read-cache.ts).
 *
 * data_version: one row; `versions` holds a counter per table listed in TABLES, which
 * goes up once in every transaction that changed a row of that table (or truncated it). The
 * increase is made by a deferred constraint trigger, i.e. at commit time, in the same commit as
 * the change: a reader that reads the versions and then the records sees records at least as new
 * as the versions, never older. A transaction-local setting per table keeps it to one increase
 * per table and transaction (an upload of ten thousand rows bumps once).
 *
 * One row rather than one per table: a writer locks it just before its commit and then takes no
 * other lock, so it cannot take part in a deadlock (rows per table, locked in whatever order the
 * changes were made, could).
 *
 * The counters start at a random number, so a database rebuilt from scratch does not repeat the
 * numbers an old one had (a running server's memory would otherwise match them).
 *
 * Tables left out change often and feed no remembered answer: sign-in attempts, the mail
 * outbox, the audit log, one-time tokens and simulation runs (progress is written every few
 * seconds while a run works); and the migration / seed bookkeeping.
 */
import { dataVersionTriggersSql } from '../versioned-tables'
import type { MigrationContext } from './context'

/**
 * The tables counted from this migration on (server/db/versioned-tables.ts lists them all, with
 * those later migrations add; this list stays as it was when this migration shipped).
 */
const TABLES = [
  'agencies', 'agency_logos', 'agency_signing_certificates', 'attachments', 'census_counts', 'comments', 'decisions',
  'effective_size_estimates', 'genetic_datasets', 'issued_briefs', 'monitoring_observations', 'proposal_versions',
  'proposals', 'scenarios', 'species', 'subpopulations', 'translocations', 'users',
]

const UP = `
CREATE TABLE data_version (
  id integer PRIMARY KEY CONSTRAINT data_version_single_row CHECK (id = 1),
  versions jsonb NOT NULL CONSTRAINT data_version_versions_object CHECK (jsonb_typeof(versions) = 'object')
);
INSERT INTO data_version (id, versions)
  SELECT 1, jsonb_object_agg(name, start)
    FROM unnest(ARRAY[${TABLES.map(table => `'${table}'`).join(', ')}]) AS name,
         (SELECT floor(random() * 4503599627370496)::bigint AS start) AS first;

CREATE FUNCTION tributary_bump_data_version() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  bumped text := 'tributary.data_version_' || TG_TABLE_NAME;
BEGIN
  IF TG_OP = 'TRUNCATE' OR current_setting(bumped, true) IS DISTINCT FROM 'yes' THEN
    UPDATE data_version
       SET versions = jsonb_set(versions, ARRAY[TG_TABLE_NAME], to_jsonb(coalesce((versions ->> TG_TABLE_NAME)::bigint, 0) + 1))
     WHERE id = 1;
    IF TG_OP <> 'TRUNCATE' THEN
      PERFORM set_config(bumped, 'yes', true);
    END IF;
  END IF;
  RETURN NULL;
END
$$;
${TABLES.map(table => dataVersionTriggersSql(table)).join('')}
`

const DOWN = `
${TABLES.map(table => `
DROP TRIGGER IF EXISTS ${table}_data_version ON ${table};
DROP TRIGGER IF EXISTS ${table}_data_version_truncate ON ${table};`).join('')}
DROP FUNCTION IF EXISTS tributary_bump_data_version();
DROP TABLE IF EXISTS data_version;
`

export async function up({ context }: { context: MigrationContext }): Promise<void> {
  await context.sequelize.query(UP, { transaction: context.transaction })
}

export async function down({ context }: { context: MigrationContext }): Promise<void> {
  await context.sequelize.query(DOWN, { transaction: context.transaction })
}
