import { Transform, type Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { stringify } from 'csv-stringify';
import type pg from 'pg';
import QueryStream from 'pg-query-stream';
import { RAW_TEXT_TYPES } from './db';
import type { ExportContext } from './run';

/** A row as PostgreSQL prints it: every value text (or null). */
export type TextRow = Record<string, string | null>;

/** What an export's queries need: the company, its calendar, and the range. */
export type ExportScope = Pick<ExportContext, 'organizationId' | 'timeZone' | 'currency' | 'from' | 'to' | 'fromInstant' | 'untilInstant'>;

/**
 * One CSV export: its rows as SQL (without ORDER BY, so the same SQL counts them), the order, and
 * a `prepare` step that reads what the header depends on (the chart's revenue accounts, the tax
 * rates in the range) in the same snapshot before the rows stream.
 */
export interface CsvExport {
  rows(scope: ExportScope): { sql: string; params: unknown[] };
  orderBy: string;
  prepare(client: pg.PoolClient, scope: ExportScope): Promise<{ header: string[]; toRecord: (row: TextRow) => string[] }>;
}

/** Rows read from the cursor per round trip; also how many wait in memory at most on each side of a stage. */
const BATCH = 200;

/**
 * Streams the rows through a server-side cursor (pg-query-stream) into csv-stringify and out:
 * RFC 4180 quoting (a field with a comma, quote or line break is quoted, a quote doubled), CRLF
 * after every record, a header row, UTF-8 with a byte order mark. Memory stays at a few batches,
 * whatever the range: each stage waits while the next one is full.
 */
export async function writeCsv(ctx: ExportContext, out: Writable, exp: CsvExport): Promise<void> {
  const { header, toRecord } = await exp.prepare(ctx.client, ctx);
  const { sql, params } = exp.rows(ctx);
  const source = ctx.client.query(new QueryStream(`${sql} ORDER BY ${exp.orderBy}`, params, { batchSize: BATCH, highWaterMark: BATCH, types: RAW_TEXT_TYPES }));
  const records = new Transform({
    objectMode: true,
    highWaterMark: BATCH,
    transform(row: TextRow, _encoding, done) {
      try {
        const record = toRecord(row);
        ctx.count();
        done(null, record);
      } catch (err) {
        done(err as Error);
      }
    },
  });
  // bom: spreadsheet programs take a file without one for their local code page, and then
  // mangle names like "Zoë" (common practice, no published source).
  const csv = stringify({ header: true, columns: header, bom: true, record_delimiter: '\r\n', quoted_match: /^\s|\s$/ });
  await pipeline(source, records, csv, out);
}

/** How many rows the export will have: the same SQL, counted. */
export async function countCsvRows(client: pg.PoolClient | pg.Pool, exp: CsvExport, scope: ExportScope): Promise<number> {
  const { sql, params } = exp.rows(scope);
  const result = await client.query<{ n: string }>({ text: `SELECT count(*)::text AS n FROM (${sql}) counted`, values: params, types: RAW_TEXT_TYPES });
  return Number(result.rows[0].n);
}
