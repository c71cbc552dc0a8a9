import type { Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { ZipArchive, type Archiver } from 'archiver';
import type pg from 'pg';
import QueryStream from 'pg-query-stream';
import type { ExportScope, TextRow } from './csv';
import { RAW_TEXT_TYPES } from './db';
import { PAID_DOCS_CTE } from './paidDocs';
import type { ExportContext } from './run';
import { ublDocument, type UblSupplier } from './ubl';

/**
 * The PDFs behind the paid-invoices CSV: each paid invoice's and credit note's own PDF, and the
 * receipt of every payment on those invoices, each once. Folder by kind, file named by number.
 */
const pdfFiles = (s: ExportScope) => ({
  sql: `
    WITH ${PAID_DOCS_CTE},
    files AS (
      SELECT CASE WHEN d.kind = 'credit_note' THEN 'credit-notes' ELSE 'invoices' END AS folder, doc.number AS name, doc.file_id, doc.sha256, doc.issued_at
        FROM paid_docs d JOIN documents doc ON doc.id = d.document_id
      UNION
      SELECT 'receipts', doc.number, doc.file_id, doc.sha256, doc.issued_at
        FROM documents doc
       WHERE doc.id IN (SELECT p.receipt_document_id FROM paid_docs d JOIN payment_allocations a ON a.invoice_id = d.id JOIN payments p ON p.id = a.payment_id)
    )`,
  params: [s.organizationId, s.fromInstant, s.untilInstant],
});

/** What the ZIP of PDFs will hold: files, and about how many bytes (stored, not compressed: PDFs are compressed already). */
export async function countPdfFiles(client: pg.PoolClient | pg.Pool, scope: ExportScope) {
  const { sql, params } = pdfFiles(scope);
  const { rows } = await client.query<{ files: string; bytes: string; names: string }>({
    text: `${sql} SELECT count(*)::text AS files, coalesce(sum(sf.size), 0)::text AS bytes, coalesce(sum(length(f.folder) + length(f.name) + 5), 0)::text AS names
             FROM files f JOIN stored_files sf ON sf.id = f.file_id`,
    values: params,
    types: RAW_TEXT_TYPES,
  });
  const files = Number(rows[0].files);
  // Per file: a local header (30 bytes) and a central directory entry (46 bytes), each with the
  // name, a data descriptor (16), ZIP64 extras archiver may add (~40); then the end record (22).
  const bytes = Number(rows[0].bytes) + Number(rows[0].names) * 2 + files * 132 + 22;
  return { files, bytes };
}

/** Appends one entry and waits until the archive has taken it, so no more than one file waits in memory. */
function append(archive: Archiver, data: Buffer | string, entry: { name: string; date: Date; store: boolean }) {
  return new Promise<void>((resolve, reject) => {
    const done = (err?: Error) => {
      archive.off('entry', onEntry).off('error', done).off('close', onClose);
      if (err) reject(err);
      else resolve();
    };
    const onEntry = () => done();
    const onClose = () => done(new Error('The download was closed.'));
    archive.on('entry', onEntry).on('error', done).on('close', onClose);
    archive.append(data, entry);
  });
}

const safeName = (name: string) => name.replace(/[^A-Za-z0-9._-]+/g, '_');

async function writeZip(ctx: ExportContext, out: Writable, sql: string, params: unknown[], addRow: (archive: Archiver, row: TextRow & { data?: Buffer }) => Promise<void>) {
  const archive = new ZipArchive({ zlib: { level: 6 } });
  const delivered = pipeline(archive, out);
  delivered.catch(() => {});
  // Rows one or two at a time: each may carry a file's bytes.
  const rows = ctx.client.query(new QueryStream(sql, params, { batchSize: 2, highWaterMark: 2, types: RAW_TEXT_TYPES }));
  try {
    for await (const row of rows as AsyncIterable<TextRow & { data?: Buffer }>) {
      if (archive.destroyed) throw new Error('The download was closed.');
      await addRow(archive, row);
      ctx.count();
    }
    await archive.finalize();
    await delivered;
  } catch (err) {
    rows.destroy();
    archive.destroy();
    throw err;
  }
}

/** The ZIP of PDFs, streamed: file bytes come from the database row by row through a cursor. */
export async function writePdfZip(ctx: ExportContext, out: Writable): Promise<void> {
  const { sql, params } = pdfFiles(ctx);
  const used = new Set<string>();
  await writeZip(
    ctx,
    out,
    // The order is fixed on file ids alone; the bytes are fetched after it, one file at a time.
    `${sql} SELECT o.folder, o.name, o.issued_at, fd.data
              FROM (SELECT * FROM files ORDER BY folder, name OFFSET 0) o
              CROSS JOIN LATERAL (SELECT data FROM stored_files sf WHERE sf.id = o.file_id) fd`,
    params,
    async (archive, row) => {
      let name = `${row.folder}/${safeName(row.name ?? 'document')}.pdf`;
      for (let n = 2; used.has(name); n++) name = `${row.folder}/${safeName(row.name ?? 'document')}-${n}.pdf`;
      used.add(name);
      await append(archive, row.data!, { name, date: new Date(row.issued_at ?? Date.now()), store: true });
    },
  );
}

const ublRows = (s: ExportScope) => ({
  sql: `
    WITH ${PAID_DOCS_CTE}
    SELECT d.id, d.number, d.kind, d.issue_date::text AS issue_date, d.due_date::text AS due_date, d.lines::text AS lines, d.reason, d.paid_at AS sort_at,
           d.tax_cents::text AS tax, d.total_cents::text AS total, (d.total_cents - d.tax_cents)::text AS net,
           (d.paid_cents + d.credited_cents)::text AS prepaid,
           (CASE WHEN d.kind = 'credit_note' THEN d.total_cents ELSE d.total_cents - d.paid_cents - d.credited_cents END)::text AS payable,
           cn.number AS credits_number, cn.issue_date::text AS credits_issue_date,
           c.name AS customer_name, c.email AS customer_email, c.phone AS customer_phone, c.billing_line1, c.billing_line2, c.billing_city,
           c.billing_region, c.billing_postal_code, b.reference AS booking,
           (SELECT json_agg(json_build_object('id', coalesce(nullif(p.reference, ''), rd.number, p.id::text), 'amount', a.amount_cents::text,
                                              'date', to_char(p.received_at AT TIME ZONE $4::text, 'YYYY-MM-DD')) ORDER BY p.received_at, p.id)
              FROM payment_allocations a JOIN payments p ON p.id = a.payment_id LEFT JOIN documents rd ON rd.id = p.receipt_document_id
             WHERE a.invoice_id = d.id) AS payments
      FROM paid_docs d
      JOIN customers c ON c.id = d.customer_id
      JOIN bookings b ON b.id = d.booking_id
      LEFT JOIN invoices cn ON cn.id = d.credits_invoice_id`,
  params: [s.organizationId, s.fromInstant, s.untilInstant, s.timeZone],
});

export async function countUblFiles(client: pg.PoolClient | pg.Pool, scope: ExportScope) {
  const { sql, params } = ublRows(scope);
  const { rows } = await client.query<{ n: string }>({ text: `SELECT count(*)::text AS n FROM (${sql}) counted`, values: params, types: RAW_TEXT_TYPES });
  return Number(rows[0].n);
}

/** The ZIP of UBL 2.1 XML documents, one per paid invoice or credit note, built as the rows stream. */
export async function writeUblZip(ctx: ExportContext, out: Writable): Promise<void> {
  const { rows: [org] } = await ctx.client.query<Record<string, string>>({
    text: `SELECT name, address_line1, address_line2, city, region, postal_code, country, phone, email FROM organizations WHERE id = $1`,
    values: [ctx.organizationId],
    types: RAW_TEXT_TYPES,
  });
  const supplier: UblSupplier = {
    name: org.name, addressLine1: org.address_line1, addressLine2: org.address_line2, city: org.city, region: org.region,
    postalCode: org.postal_code, country: org.country, phone: org.phone, email: org.email,
  };
  const { sql, params } = ublRows(ctx);
  await writeZip(ctx, out, `${sql} ORDER BY sort_at, number`, params, async (archive, row) => {
    await append(archive, ublDocument(row, supplier, ctx.currency), { name: `${safeName(row.number ?? 'invoice')}.xml`, date: new Date(`${row.issue_date}T12:00:00Z`), store: false });
  });
}
