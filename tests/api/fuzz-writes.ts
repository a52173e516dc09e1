/**
 * Sees every committed row change in the test database: a row trigger on each table of the
 * public schema (but the data_version bookkeeping row) appends (table, operation) to
 * `write_watch_log`. Rolled-back transactions leave no entry, so after a refused request the log
 * must not have grown.
 *
 *   const watch = await installWriteWatch(server.db)
 *   let mark = await watch.mark()
 *   … one request …
 *   const { writes, next } = await watch.since(mark)   // writes must be [] after a refused request
 *   mark = next
 */
import type pg from 'pg'

/** One committed row change. */
export interface RowWrite { table: string, operation: 'INSERT' | 'UPDATE' | 'DELETE' }

export interface WriteWatch {
  /** The position of the newest entry (0 when none). */
  mark(): Promise<number>
  /** Changes committed after `mark`, oldest first, and the mark to use next. */
  since(mark: number): Promise<{ writes: RowWrite[], next: number }>
  /** Removes the triggers, the function and the log. */
  uninstall(): Promise<void>
}

const LOG = 'write_watch_log'
const TRIGGER = 'write_watch'
const FUNCTION = 'write_watch_record'

/**
 * Adds the log table and the triggers to the database behind `db` (the test's private copy).
 *
 * @param db - pool on the test database
 */
export async function installWriteWatch(db: pg.Pool): Promise<WriteWatch> {
  await db.query(`CREATE TABLE ${LOG} (id bigserial PRIMARY KEY, table_name text NOT NULL, operation text NOT NULL)`)
  await db.query(`CREATE FUNCTION ${FUNCTION}() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      INSERT INTO ${LOG} (table_name, operation) VALUES (TG_TABLE_NAME, TG_OP);
      RETURN NULL;
    END $$`)
  // data_version (migration 0009) is bookkeeping: it moves only at the commit of a change to
  // another table, which the watch already sees.
  const tables = await db.query<{ name: string }>(
    `SELECT tablename AS name FROM pg_tables WHERE schemaname = 'public' AND tablename <> ALL($1)`, [[LOG, 'data_version']],
  )
  for (const { name } of tables.rows) {
    await db.query(`CREATE TRIGGER ${TRIGGER} AFTER INSERT OR UPDATE OR DELETE ON "${name}" FOR EACH ROW EXECUTE FUNCTION ${FUNCTION}()`)
  }
  return {
    async mark() {
      const result = await db.query<{ id: string | null }>(`SELECT max(id) AS id FROM ${LOG}`)
      return Number(result.rows[0]?.id ?? 0)
    },
    async since(mark) {
      const result = await db.query<{ id: string, table_name: string, operation: RowWrite['operation'] }>(
        `SELECT id, table_name, operation FROM ${LOG} WHERE id > $1 ORDER BY id`, [mark],
      )
      const writes = result.rows.map(row => ({ table: row.table_name, operation: row.operation }))
      return { writes, next: result.rows.reduce((highest, row) => Math.max(highest, Number(row.id)), mark) }
    },
    async uninstall() {
      for (const { name } of tables.rows) await db.query(`DROP TRIGGER IF EXISTS ${TRIGGER} ON "${name}"`)
      await db.query(`DROP FUNCTION IF EXISTS ${FUNCTION}() CASCADE`)
      await db.query(`DROP TABLE IF EXISTS ${LOG}`)
    },
  }
}
