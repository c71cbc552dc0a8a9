/**
 * The owner's reports (owner and bookkeeper; the office and crew get 403). Each figure comes with
 * what is behind it; `GET /entries` lists the journal entries a figure's trace names. Every query
 * is scoped to the signed-in user's company, and reads one snapshot of the books.
 */
import { Router } from 'express';
import { addDays } from '../../../shared/dates';
import {
  AtDateQuery, EntriesQuery, MonthRangeQuery, PeriodQuery, RevenueQuery,
  type AgingReport, type DepositsReport, type RevenueReport, type SalesTaxReport, type ShortfallsReport, type StockReport, type TracedEntries,
} from '../../../shared/schemas/reports';
import { auth, authenticate } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { IdParams } from '../../../shared/schemas/common';
import { Item } from '../../models';
import { authorize, sameOrganization } from '../../policies';
import { agingReport } from '../../services/reports/aging';
import { readReport, todayIn } from '../../services/reports/common';
import { depositsReport } from '../../services/reports/deposits';
import { tracedEntries } from '../../services/reports/entries';
import { revenueReport } from '../../services/reports/revenue';
import { salesTaxReport } from '../../services/reports/salesTax';
import { shortfallsReport } from '../../services/reports/shortfalls';
import { stockReport } from '../../services/reports/stock';

export const reportsRouter = Router();

/** This year so far, in the company's calendar, for what the query leaves out. */
const periodOf = (q: PeriodQuery, today: string) => {
  const to = q.to ?? (q.from && q.from > today ? q.from : today);
  return { from: q.from ?? `${to.slice(0, 4)}-01-01`, to };
};

reportsRouter.get('/aging', authenticate, validate(AtDateQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'report', 'read');
  const { at } = parsed<AtDateQuery>(res, 'query');
  const body: AgingReport = await readReport(organization, (ctx) => agingReport(ctx, at ?? todayIn(ctx.timeZone)));
  res.json(body);
});

reportsRouter.get('/deposits', authenticate, validate(AtDateQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'report', 'read');
  const { at } = parsed<AtDateQuery>(res, 'query');
  const body: DepositsReport = await readReport(organization, (ctx) => depositsReport(ctx, at ?? todayIn(ctx.timeZone)));
  res.json(body);
});

reportsRouter.get('/sales-tax', authenticate, validate(MonthRangeQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'report', 'read');
  const q = parsed<MonthRangeQuery>(res, 'query');
  const thisMonth = todayIn(organization.timeZone).slice(0, 7);
  const to = q.to ?? (q.from && q.from > thisMonth ? q.from : thisMonth);
  const from = q.from ?? `${to.slice(0, 4)}-01`;
  const body: SalesTaxReport = await readReport(organization, (ctx) => salesTaxReport(ctx, from, to));
  res.json(body);
});

reportsRouter.get('/revenue', authenticate, validate(RevenueQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'report', 'read');
  const year = parsed<RevenueQuery>(res, 'query').year ?? Number(todayIn(organization.timeZone).slice(0, 4));
  const body: RevenueReport = await readReport(organization, (ctx) => revenueReport(ctx, year));
  res.json(body);
});

reportsRouter.get('/stock', authenticate, validate(PeriodQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'report', 'read');
  const { from, to } = periodOf(parsed<PeriodQuery>(res, 'query'), todayIn(organization.timeZone));
  const body: StockReport = await readReport(organization, (ctx) => stockReport(ctx, from, to));
  res.json(body);
});

reportsRouter.get('/stock/items/:id', authenticate, validate(IdParams, 'params'), validate(PeriodQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'report', 'read');
  const item = sameOrganization(user, await Item.findByPk(parsed<{ id: string }>(res, 'params').id, { attributes: ['id', 'organizationId'] }), 'That item');
  const { from, to } = periodOf(parsed<PeriodQuery>(res, 'query'), todayIn(organization.timeZone));
  const body: StockReport = await readReport(organization, (ctx) => stockReport(ctx, from, to, { itemId: item.id }));
  res.json(body);
});

reportsRouter.get('/shortfalls', authenticate, validate(PeriodQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'report', 'read');
  // What to buy next looks both ways: last year's refusals and the coming season's, a year each side of today.
  const q = parsed<PeriodQuery>(res, 'query');
  const today = todayIn(organization.timeZone);
  const from = q.from ?? (q.to && q.to < addDays(today, -365) ? `${q.to.slice(0, 4)}-01-01` : addDays(today, -365));
  const to = q.to ?? (from > addDays(today, 365) ? from : addDays(today, 365));
  const body: ShortfallsReport = await readReport(organization, (ctx) => shortfallsReport(ctx, from, to));
  res.json(body);
});

reportsRouter.get('/entries', authenticate, validate(EntriesQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'report', 'read');
  const body: TracedEntries = await readReport(organization, (ctx) => tracedEntries(ctx, parsed<EntriesQuery>(res, 'query')));
  res.json(body);
});
