import { getTableColumns, sql, type SQL } from 'drizzle-orm';
import type { PgTable } from 'drizzle-orm/pg-core';
import type { Database } from '../db/client';

/**
 * Batch writes in one statement each, whatever the number of rows: the rows travel as ONE JSON
 * parameter that PostgreSQL spreads into the table's columns (json_populate_recordset). So no statement
 * comes near the 65,535 bind-parameter limit, and no query text grows with the batch: building
 * multi-row VALUES lists with thousands of parameters was most of the cost of a push.
 */

/**
 * The rows as JSON keyed by column name, with the column list they fill: the given fields, or every
 * field of the first row (a field left out takes its column default; one set to undefined is null).
 */
function asJson<T extends PgTable>(table: T, rows: readonly Partial<T['$inferSelect']>[], fields?: readonly string[]): { columns: SQL; json: string } {
  const present = Object.entries(getTableColumns(table)).filter(([key]) => (fields ? fields.includes(key) : key in rows[0]!));
  const json = JSON.stringify(rows.map((row) => Object.fromEntries(present.map(([key, column]) => [column.name, row[key as keyof typeof row] ?? null]))));
  return { columns: sql.join(present.map(([, column]) => sql.identifier(column.name)), sql`, `), json };
}

export async function insertRows<T extends PgTable>(tx: Database, table: T, rows: readonly T['$inferInsert'][]): Promise<void> {
  if (rows.length === 0) return;
  const { columns, json } = asJson(table, rows as Partial<T['$inferSelect']>[]);
  await tx.execute(sql`insert into ${table} (${columns}) select ${columns} from json_populate_recordset(null::${table}, ${json}::json)`);
}

/** Sets the named columns of each row, found by its key column. */
export async function updateRows<T extends PgTable>(
  tx: Database,
  table: T,
  key: keyof T['$inferSelect'] & string,
  set: readonly (keyof T['$inferSelect'] & string)[],
  rows: readonly Partial<T['$inferSelect']>[],
): Promise<void> {
  if (rows.length === 0) return;
  const { json } = asJson(table, rows, [key, ...set]);
  const all = getTableColumns(table);
  const name = (field: string) => sql.identifier(all[field]!.name);
  const assignments = sql.join(set.map((field) => sql`${name(field)} = changed.${name(field)}`), sql`, `);
  await tx.execute(sql`update ${table} set ${assignments} from json_populate_recordset(null::${table}, ${json}::json) as changed
    where ${table}.${name(key)} = changed.${name(key)}`);
}
