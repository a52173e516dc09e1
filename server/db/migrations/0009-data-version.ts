/**
 * A version number for the records, so the server can keep answers to frequent reads in memory
 * and still never hand out an old one (server/utils/read-cache.ts).
 *
 * data_version: one row; `version` goes up once in every transaction that changed a row of a
 * table listed in VERSIONED_TABLES (or truncated one). The increase is made by a deferred
 * constraint trigger, i.e. at commit time, in the same commit as the change: a reader that
 * reads the version and then the records sees records at least as new as the version, never
 * older. A transaction-local setting keeps it to one increase per transaction (an upload of ten
 * thousand rows bumps it once). Being the last lock a writer takes, just before its commit, the
 * row cannot take part in a deadlock.
 *
 * The first value is random, so a database rebuilt from scratch does not repeat the numbers an
 * old one had (a running server's memory would otherwise match them).
 *
 * Tables left out change often and feed no remembered answer: sign-in attempts, the mail
 * outbox, the audit log, one-time tokens and simulation runs (progress is written every few
 * seconds while a run works); and the migration / seed bookkeeping.
 */
import type { MigrationContext } from './context'

/** Every table whose changes make remembered answers old. A new table must be added here (tests/db/data-version.test.ts checks). */
export const VERSIONED_TABLES = [
  'agencies', 'agency_logos', 'agency_signing_certificates', 'attachments', 'census_counts', 'comments', 'decisions',
  'effective_size_estimates', 'genetic_datasets', 'issued_briefs', 'monitoring_observations', 'proposal_versions',
  'proposals', 'scenarios', 'species', 'subpopulations', 'translocations', 'users',
] as const

const UP = `
CREATE TABLE data_version (
  id integer PRIMARY KEY CONSTRAINT data_version_single_row CHECK (id = 1),
  version bigint NOT NULL
);
INSERT INTO data_version (id, version) VALUES (1, floor(random() * 4503599627370496)::bigint);

CREATE FUNCTION tributary_bump_data_version() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF current_setting('tributary.data_version_bumped', true) IS DISTINCT FROM 'yes' THEN
    UPDATE data_version SET version = version + 1 WHERE id = 1;
    PERFORM set_config('tributary.data_version_bumped', 'yes', true);
  END IF;
  RETURN NULL;
END
$$;

CREATE FUNCTION tributary_bump_data_version_now() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  UPDATE data_version SET version = version + 1 WHERE id = 1;
  RETURN NULL;
END
$$;
${VERSIONED_TABLES.map(table => `
CREATE CONSTRAINT TRIGGER ${table}_data_version AFTER INSERT OR UPDATE OR DELETE ON ${table}
  DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION tributary_bump_data_version();
CREATE TRIGGER ${table}_data_version_truncate AFTER TRUNCATE ON ${table}
  FOR EACH STATEMENT EXECUTE FUNCTION tributary_bump_data_version_now();`).join('')}
`

const DOWN = `
${VERSIONED_TABLES.map(table => `
DROP TRIGGER IF EXISTS ${table}_data_version ON ${table};
DROP TRIGGER IF EXISTS ${table}_data_version_truncate ON ${table};`).join('')}
DROP FUNCTION IF EXISTS tributary_bump_data_version();
DROP FUNCTION IF EXISTS tributary_bump_data_version_now();
DROP TABLE IF EXISTS data_version;
`

export async function up({ context }: { context: MigrationContext }): Promise<void> {
  await context.sequelize.query(UP, { transaction: context.transaction })
}

export async function down({ context }: { context: MigrationContext }): Promise<void> {
  await context.sequelize.query(DOWN, { transaction: context.transaction })
}
