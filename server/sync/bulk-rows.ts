import { getTableColumns, sql, type SQL } from 'drizzle-orm';
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core';
import type { Database } from '../db/client';

/**
 * Batch writes in one statement, whatever the number of rows: the rows of each write travel as ONE JSON
 * parameter, each row an array of its column values, that PostgreSQL reads back into the columns. So no
 * statement comes near the 65,535 bind-parameter limit, and no query text grows with the batch: building
 * multi-row VALUES lists with thousands of parameters was most of the cost of a push. The parameter is
 * read as jsonb, not json (json parses every jsonb column's text a second time), and rows as arrays are
 * a quarter shorter than rows keyed by column name. All writes of a batch go in one statement
 * (`writeTogether`), as each round trip costs about as much as a small write (all measured by bench:sync).
 */

/** A column stored as the row's value plus an amount, e.g. change numbers counted on from a counter. */
export interface Shift {
  field: string;
  by: SQL;
}

/**
 * The columns the rows fill (the given fields, or every field of the first row: a field left out takes
 * its column default, one set to undefined is null), and the rows as JSON arrays of those columns' values.
 */
function asJson<T extends PgTable>(table: T, rows: readonly Partial<T['$inferSelect']>[], fields?: readonly string[]) {
  const present = Object.entries(getTableColumns(table)).filter(([key]) => (fields ? fields.includes(key) : key in rows[0]!));
  const json = JSON.stringify(rows.map((row) => present.map(([key]) => row[key as keyof typeof row] ?? null)));
  return { present, json };
}

/** One column of a row sent as a JSON array, as its column's type (a JSON null is NULL, as for any column). */
function columnOf(column: PgColumn, index: number): SQL {
  const type = column.getSQLType();
  const at = sql.raw(String(index));
  if (type === 'jsonb') return sql`nullif(source.row -> ${at}, 'null'::jsonb)`;
  if (type.endsWith('[]')) {
    return sql`array(select element from jsonb_array_elements_text(source.row -> ${at}) with ordinality as e(element, n) order by n)::${sql.raw(type)}`;
  }
  return sql`(source.row ->> ${at})::${sql.raw(type)}`;
}

const valueOf = (field: string, column: PgColumn, index: number, shift: Shift | undefined) =>
  field === shift?.field ? sql`${columnOf(column, index)} + ${shift.by}` : columnOf(column, index);

/** Inserts the rows; undefined when there are none. */
export function insertRows<T extends PgTable>(table: T, rows: readonly T['$inferInsert'][], shift?: Shift): SQL | undefined {
  if (rows.length === 0) return undefined;
  const { present, json } = asJson(table, rows as Partial<T['$inferSelect']>[]);
  const columns = sql.join(present.map(([, column]) => sql.identifier(column.name)), sql`, `);
  const values = sql.join(present.map(([field, column], index) => valueOf(field, column, index, shift)), sql`, `);
  return sql`insert into ${table} (${columns}) select ${values} from jsonb_array_elements(${json}::jsonb) as source(row)`;
}

/** Sets the named columns of each row, found by its key column; undefined when there are no rows. */
export function updateRows<T extends PgTable>(
  table: T,
  key: keyof T['$inferSelect'] & string,
  set: readonly (keyof T['$inferSelect'] & string)[],
  rows: readonly Partial<T['$inferSelect']>[],
  shift?: Shift,
): SQL | undefined {
  if (rows.length === 0) return undefined;
  const { present, json } = asJson(table, rows, [key, ...set]);
  const at = (field: string) => present.findIndex(([name]) => name === field);
  const column = (field: string) => present[at(field)]![1];
  const target = sql`${table}.${sql.identifier(column(key).name)}`;
  const assignments = sql.join(set.map((field) => sql`${sql.identifier(column(field).name)} = ${valueOf(field, column(field), at(field), shift)}`), sql`, `);
  // The keys once more as an array, which the planner looks up in the key's index: it guesses 100 rows for
  // any function's result, and for those it reads the whole table.
  const keys = sql`${sql.param(rows.map((row) => row[key]))}::${sql.raw(column(key).getSQLType())}[]`;
  return sql`update ${table} set ${assignments} from jsonb_array_elements(${json}::jsonb) as source(row)
    where ${target} = any(${keys}) and ${target} = ${columnOf(column(key), at(key))}`;
}

/**
 * Runs the writes as ONE statement, each a part of its WITH, under its name (a write may read the rows
 * another returns by that name). PostgreSQL runs every part; they see the same snapshot, so no two may
 * write the same row.
 */
export async function writeTogether(tx: Database, writes: Record<string, SQL | undefined>): Promise<void> {
  const parts = Object.entries(writes).flatMap(([name, write]) => (write ? [sql`${sql.identifier(name)} as (${write})`] : []));
  if (parts.length > 0) await tx.execute(sql`with ${sql.join(parts, sql`, `)} select 1`);
}
