/**
 * The tables whose commits move their counter in `data_version` (migration 0009-data-version),
 * i.e. the tables a remembered answer may read (server/utils/read-cache.ts). A migration that
 * adds a table creates its two triggers (the SQL of `dataVersionTriggersSql`) and the table is
 * appended here; tests/db/data-version.test.ts checks that every table is either here, with its
 * triggers, or left out on purpose.
 */
export const VERSIONED_TABLES = [
  'agencies', 'agency_logos', 'agency_signing_certificates', 'attachments', 'census_counts', 'comments', 'decisions',
  'effective_size_estimates', 'genetic_datasets', 'issued_briefs', 'monitoring_observations', 'proposal_versions',
  'proposals', 'scenarios', 'species', 'subpopulations', 'translocations', 'users',
] as const

/** A table whose changes are counted. */
export type VersionedTable = typeof VERSIONED_TABLES[number]

/** The triggers that count a table's commits (deferred to commit time) and its truncations. */
export function dataVersionTriggersSql(table: string): string {
  return `
CREATE CONSTRAINT TRIGGER ${table}_data_version AFTER INSERT OR UPDATE OR DELETE ON ${table}
  DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION tributary_bump_data_version();
CREATE TRIGGER ${table}_data_version_truncate AFTER TRUNCATE ON ${table}
  FOR EACH STATEMENT EXECUTE FUNCTION tributary_bump_data_version();`
}
