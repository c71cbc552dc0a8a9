import { Router, type Request, type Response } from 'express';
import { Op } from 'sequelize';
import {
  EXPORT_FORMATS, ExportHistoryQuery, ExportKindParams, ExportRangeQuery, exportFilename, TrialBalanceExportQuery, type ExportCount, type ExportKind, type ExportRunRow,
} from '../../../shared/schemas/exports';
import { IdParams, type ListQuery } from '../../../shared/schemas/common';
import { auth, authenticate } from '../../middlewares/authenticate';
import { fieldErrors, parsed, validate } from '../../middlewares/validate';
import { badRequest, notFound } from '../../errors';
import { ExportRun, User } from '../../models';
import { authorize } from '../../policies';
import { countCsvRows, writeCsv, type CsvExport, type ExportScope } from '../../services/exports/csv';
import { exportPool } from '../../services/exports/db';
import { invoiceLinesCsv } from '../../services/exports/invoiceLines';
import { journalCsv, trialBalanceCsv } from '../../services/exports/journal';
import { paidInvoicesCsv } from '../../services/exports/paidInvoices';
import { paymentsCsv } from '../../services/exports/payments';
import { markCancelled, rangeInstants, runExport, sweepStoppedRuns, type ExportWriter } from '../../services/exports/run';
import { countPdfFiles, countUblFiles, writePdfZip, writeUblZip } from '../../services/exports/zip';

export const exportsRouter = Router();

const CSV: Record<'paid-invoices' | 'invoice-lines' | 'payments' | 'journal' | 'trial-balance', CsvExport> = {
  'paid-invoices': paidInvoicesCsv,
  'invoice-lines': invoiceLinesCsv,
  payments: paymentsCsv,
  journal: journalCsv,
  'trial-balance': trialBalanceCsv,
};

const WRITERS: Record<ExportKind, ExportWriter> = {
  ...(Object.fromEntries(Object.entries(CSV).map(([kind, exp]) => [kind, (ctx, out) => writeCsv(ctx, out, exp)])) as Record<keyof typeof CSV, ExportWriter>),
  invoices: writePdfZip,
  ubl: writeUblZip,
};

/** The range of a request: `from`/`to`, or the trial balance's `at` (its last day). */
function rangeOf(kind: ExportKind, res: Response): { from: string | null; to: string } {
  if (kind === 'trial-balance') return { from: null, to: parsed<TrialBalanceExportQuery>(res, 'query').at };
  const q = parsed<ExportRangeQuery>(res, 'query');
  return { from: q.from, to: q.to };
}

const download = (kind: ExportKind) => async (req: Request, res: Response) => {
  const { user, organization } = auth(req);
  authorize(user, 'export', 'run');
  await runExport(res, { user, organization, kind, format: EXPORT_FORMATS[kind], ...rangeOf(kind, res), write: WRITERS[kind] });
};

exportsRouter.get('/history', authenticate, validate(ExportHistoryQuery, 'query'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'export', 'history');
  const q = parsed<ListQuery>(res, 'query');
  // A run whose server stopped half way would otherwise say running for ever.
  await sweepStoppedRuns(user.organizationId);
  const { rows, count } = await ExportRun.findAndCountAll({
    where: { organizationId: user.organizationId },
    order: [['startedAt', 'DESC'], ['id', 'ASC']],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  const userIds = [...new Set(rows.map((r) => r.userId).filter((id): id is string => !!id))];
  const names = new Map(
    userIds.length ? (await User.findAll({ where: { id: { [Op.in]: userIds }, organizationId: user.organizationId }, attributes: ['id', 'name'] })).map((u) => [u.id, u.name]) : [],
  );
  const data: ExportRunRow[] = rows.map((r) => ({
    id: r.id,
    kind: r.kind,
    from: r.fromDate,
    to: r.toDate,
    status: r.status,
    rows: Number(r.rowCount),
    bytes: Number(r.byteCount),
    startedAt: r.startedAt.toISOString(),
    finishedAt: r.finishedAt ? r.finishedAt.toISOString() : null,
    by: r.userId ? (names.get(r.userId) ?? null) : null,
    error: r.error,
    filename: exportFilename(r.kind, r.fromDate, r.toDate),
  }));
  res.json({ data, total: count });
});

/**
 * The screen cancelled a download it had started (the X-Export-Run header named the run): the
 * history says cancelled even when the server had already sent everything. Only the person who
 * ran it, in their own company.
 */
exportsRouter.post('/history/:id/cancel', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'export', 'run');
  if (!(await markCancelled(parsed<{ id: string }>(res, 'params').id, user))) throw notFound('That export');
  res.status(204).end();
});

/**
 * How much a download will hold, for the progress bar: a CSV's data rows (the client counts the
 * rows it has read), a ZIP's files, and for the PDF ZIP its size near enough (the client counts bytes).
 */
exportsRouter.get('/:kind/count', authenticate, validate(ExportKindParams, 'params'), async (req, res) => {
  const { user, organization } = auth(req);
  const { kind } = parsed<{ kind: ExportKind }>(res, 'params');
  const query = (kind === 'trial-balance' ? TrialBalanceExportQuery : ExportRangeQuery).safeParse(req.query);
  if (!query.success) {
    const fields = fieldErrors(query.error);
    const n = Object.keys(fields).length;
    throw badRequest(n === 1 ? Object.values(fields)[0] : `Check the ${n} highlighted fields.`, fields);
  }
  authorize(user, 'export', 'run');
  const { from, to } = 'at' in query.data ? { from: null, to: query.data.at } : { from: query.data.from, to: query.data.to };
  const scope: ExportScope = {
    organizationId: organization.id, timeZone: organization.timeZone, currency: organization.currency, from, to, ...rangeInstants(from, to, organization.timeZone),
  };
  let body: ExportCount;
  if (kind === 'invoices') {
    const { files, bytes } = await countPdfFiles(exportPool(), scope);
    body = { kind, rows: files, bytes };
  } else if (kind === 'ubl') {
    body = { kind, rows: await countUblFiles(exportPool(), scope), bytes: null };
  } else {
    body = { kind, rows: await countCsvRows(exportPool(), CSV[kind], scope), bytes: null };
  }
  res.json(body);
});

exportsRouter.get('/trial-balance.csv', authenticate, validate(TrialBalanceExportQuery, 'query'), download('trial-balance'));
for (const kind of ['paid-invoices', 'invoice-lines', 'payments', 'journal'] as const) {
  exportsRouter.get(`/${kind}.csv`, authenticate, validate(ExportRangeQuery, 'query'), download(kind));
}
exportsRouter.get('/invoices.zip', authenticate, validate(ExportRangeQuery, 'query'), download('invoices'));
exportsRouter.get('/ubl.zip', authenticate, validate(ExportRangeQuery, 'query'), download('ubl'));
