import { Transform, type Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type pg from 'pg';
import QueryStream from 'pg-query-stream';
import { RAW_TEXT_TYPES } from './db';
import { safeText } from './format';
import type { ExportContext } from './run';

/** A row as PostgreSQL prints it: every value text (or null). */
export type TextRow = Record<string, string | null>;

/** What an export's queries need: the company, its calendar, and the range. */
export type ExportScope = Pick<ExportContext, 'organizationId' | 'timeZone' | 'currency' | 'from' | 'to' | 'fromInstant' | 'untilInstant'>;

/** A column of amounts: its cells are printed as they are ("-12.50" is a number, not a formula). */
export interface AmountColumn {
  amount: string;
}
/** A header column marked as holding amounts; every other column holds text. */
export const amountColumn = (title: string): AmountColumn => ({ amount: title });

/**
 * The header, and how a row becomes its record (one field per header column). Every cell of a
 * column that is not an `amountColumn`, and every header title, is text and goes through
 * `safeText` in `writeCsv`: one rule for every export, so no column can be forgotten.
 */
export interface CsvLayout {
  header: (string | AmountColumn)[];
  toRecord: (row: TextRow) => string[];
}

/**
 * One CSV export: its rows as SQL (without ORDER BY, so the same SQL counts them), the order, and
 * a `prepare` step that reads what the header depends on (the chart's revenue accounts, the tax
 * rates in the range) in the same snapshot before the rows stream. Where reading that separately
 * would cost another pass over the rows, `prepare` answers a function instead, and the layout is
 * made from the first row (null when there are none), whose SQL then carries it.
 */
export interface CsvExport {
  rows(scope: ExportScope): { sql: string; params: unknown[] };
  orderBy: string;
  /** SET LOCAL statements for the rows query, run in the export's transaction just before it. */
  settings?: string[];
  prepare(client: pg.PoolClient, scope: ExportScope): Promise<CsvLayout | ((first: TextRow | null) => CsvLayout)>;
}

/**
 * Rows read from the cursor per round trip; also how many wait in memory at most before the CSV
 * stage (a few hundred kilobytes of text).
 */
const BATCH = 1000;

/** CSV text gathered before it goes out as one chunk: fewer, larger writes to the response. */
const CHUNK_CHARS = 64 * 1024;

/**
 * A field is quoted when it holds a quote, a comma or a line break of any kind, CRLF or a bare LF
 * or CR (RFC 4180 §2 rules 5-7; every reader takes a bare one as the end of the record), and when
 * it starts or ends with white space, which spreadsheet programs would otherwise trim.
 */
const NEEDS_QUOTES = /[",\r\n]|^\s|\s$/;

/** One record as a CSV line, CRLF included (RFC 4180 §2 rule 1); fields past `width` are left out. */
export function csvLine(record: readonly (string | null | undefined)[], width = record.length): string {
  let line = '';
  const n = Math.min(record.length, width);
  for (let i = 0; i < n; i++) {
    const field = record[i] ?? '';
    if (i > 0) line += ',';
    line += NEEDS_QUOTES.test(field) ? `"${field.replace(/"/g, '""')}"` : field;
  }
  return `${line}\r\n`;
}

interface TextCells {
  /** The header's titles, defused like any text cell. */
  titles: string[];
  isAmount: boolean[];
  toRecord: CsvLayout['toRecord'];
}

function textCells(layout: CsvLayout): TextCells {
  return {
    titles: layout.header.map((h) => safeText(typeof h === 'string' ? h : h.amount)),
    isAmount: layout.header.map((h) => typeof h !== 'string'),
    toRecord: layout.toRecord,
  };
}

/**
 * Streams the rows through a server-side cursor (pg-query-stream), turns each into a CSV line
 * (text cells defused by `safeText`, then csvLine) and sends the lines out in chunks of about
 * 64 kB: a header row first, after a UTF-8 byte order mark. Memory stays at a batch and a chunk, whatever the range: each stage waits
 * while the next one is full.
 */
export async function writeCsv(ctx: ExportContext, out: Writable, exp: CsvExport): Promise<void> {
  const prepared = await exp.prepare(ctx.client, ctx);
  for (const setting of exp.settings ?? []) await ctx.client.query(setting);
  const { sql, params } = exp.rows(ctx);
  const source = ctx.client.query(new QueryStream(`${sql} ORDER BY ${exp.orderBy}`, params, { batchSize: BATCH, highWaterMark: BATCH, types: RAW_TEXT_TYPES }));
  // bom: spreadsheet programs take a file without one for their local code page, and then
  // mangle names like "Zoë" (common practice, no published source).
  let pending = '\ufeff';
  let layout: TextCells | null = null;
  const begin = (first: TextRow | null): TextCells => {
    layout = textCells(typeof prepared === 'function' ? prepared(first) : prepared);
    pending += csvLine(layout.titles);
    return layout;
  };
  if (typeof prepared !== 'function') begin(null);
  const lines = new Transform({
    writableObjectMode: true,
    writableHighWaterMark: BATCH,
    transform(row: TextRow, _encoding, done) {
      try {
        const { titles, isAmount, toRecord } = layout ?? begin(row);
        const record = toRecord(row);
        for (let i = 0; i < titles.length; i++) if (!isAmount[i]) record[i] = safeText(record[i]);
        pending += csvLine(record, titles.length);
        ctx.count();
      } catch (err) {
        done(err as Error);
        return;
      }
      if (pending.length >= CHUNK_CHARS) {
        this.push(pending);
        pending = '';
      }
      done();
    },
    flush(done) {
      try {
        if (!layout) begin(null);
      } catch (err) {
        done(err as Error);
        return;
      }
      done(null, pending);
    },
  });
  await pipeline(source, lines, out);
}

/** How many rows the export will have: the same SQL, counted. */
export async function countCsvRows(client: pg.PoolClient | pg.Pool, exp: CsvExport, scope: ExportScope): Promise<number> {
  const { sql, params } = exp.rows(scope);
  const result = await client.query<{ n: string }>({ text: `SELECT count(*)::text AS n FROM (${sql}) counted`, values: params, types: RAW_TEXT_TYPES });
  return Number(result.rows[0].n);
}
