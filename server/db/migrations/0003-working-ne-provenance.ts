/**
 * Provenance of a subpopulation's working Ne: which saved estimate it was taken from (if any),
 * who chose it and when. The reason was already required (subpopulations_working_ne_has_reason).
 *
 * - working_ne_estimate_id → effective_size_estimates, with a composite key so the estimate must
 *   belong to the same subpopulation; NO ACTION, so the estimate behind the working Ne cannot be
 *   deleted (the route answers 409 first; deleting the subpopulation removes both together).
 * - working_ne_set_by → users, SET NULL (a note, like other creator columns).
 * The link holds only while the working Ne equals the estimate's value: PATCH
 * /api/subpopulations/:id may change or clear the working Ne without touching these columns, so
 * readers compare the values (server/record/effective-size-dto.ts) instead of a CHECK here.
 */
import type { MigrationContext } from './context'

const UP = `
ALTER TABLE effective_size_estimates
  ADD CONSTRAINT effective_size_estimates_id_subpopulation_unique UNIQUE (id, subpopulation_id);

ALTER TABLE subpopulations
  ADD COLUMN working_ne_estimate_id integer,
  ADD COLUMN working_ne_set_by integer REFERENCES users (id) ON DELETE SET NULL,
  ADD COLUMN working_ne_set_at timestamptz,
  ADD CONSTRAINT subpopulations_working_ne_estimate_fk
    FOREIGN KEY (working_ne_estimate_id, id) REFERENCES effective_size_estimates (id, subpopulation_id) ON DELETE NO ACTION;

CREATE INDEX subpopulations_working_ne_estimate_id_idx ON subpopulations (working_ne_estimate_id);
CREATE INDEX subpopulations_working_ne_set_by_idx ON subpopulations (working_ne_set_by);
`

const DOWN = `
DROP INDEX IF EXISTS subpopulations_working_ne_set_by_idx;
DROP INDEX IF EXISTS subpopulations_working_ne_estimate_id_idx;
ALTER TABLE subpopulations
  DROP CONSTRAINT IF EXISTS subpopulations_working_ne_estimate_fk,
  DROP COLUMN IF EXISTS working_ne_set_at,
  DROP COLUMN IF EXISTS working_ne_set_by,
  DROP COLUMN IF EXISTS working_ne_estimate_id;
ALTER TABLE effective_size_estimates DROP CONSTRAINT IF EXISTS effective_size_estimates_id_subpopulation_unique;
`

export async function up({ context }: { context: MigrationContext }): Promise<void> {
  await context.sequelize.query(UP, { transaction: context.transaction })
}

export async function down({ context }: { context: MigrationContext }): Promise<void> {
  await context.sequelize.query(DOWN, { transaction: context.transaction })
}
