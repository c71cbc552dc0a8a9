/**
 * Bulk inserts through `pg`: one INSERT ... SELECT FROM unnest(...) per chunk, each column sent
 * as one text array and cast to its column type by PostgreSQL. Thousands of rows per round trip,
 * and the rows still pass every constraint and trigger of the schema.
 */
import type pg from 'pg';

export type Value = string | number | boolean | Date | null | undefined;
/** A column: its name and the SQL type its text is cast to (`uuid`, `bigint`, `enum_bookings_status` ...). */
export type Column = [name: string, type: string];

const text = (v: Value): string | null => (v === null || v === undefined ? null : v instanceof Date ? v.toISOString() : String(v));

export async function insertRows(client: pg.ClientBase, table: string, columns: Column[], rows: Value[][], chunk = 5_000): Promise<void> {
  const names = columns.map(([n]) => `"${n}"`).join(', ');
  const casts = columns.map(([n, type]) => `u."${n}"::${type}`).join(', ');
  const arrays = columns.map((_, i) => `$${i + 1}::text[]`).join(', ');
  const sql = `INSERT INTO ${table} (${names}) SELECT ${casts} FROM unnest(${arrays}) AS u(${names})`;
  for (let start = 0; start < rows.length; start += chunk) {
    const part = rows.slice(start, start + chunk);
    await client.query(sql, columns.map((_, i) => part.map((r) => text(r[i]))));
  }
}
