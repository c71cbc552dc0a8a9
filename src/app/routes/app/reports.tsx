import type { QueryClient } from '@tanstack/react-query';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { AtDateQuery, MonthRangeQuery, PeriodQuery, RevenueQuery } from '@shared/schemas/reports';
import { PageHeader } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api';
import { cn } from '@/lib/cn';
import { agingQueryOptions, useAging } from '@/features/reports/api/get-aging';
import { depositsQueryOptions, useDeposits } from '@/features/reports/api/get-deposits';
import { revenueQueryOptions, useRevenue } from '@/features/reports/api/get-revenue';
import { salesTaxQueryOptions, useSalesTax } from '@/features/reports/api/get-sales-tax';
import { shortfallsQueryOptions, useShortfalls } from '@/features/reports/api/get-shortfalls';
import { stockQueryOptions, useStock } from '@/features/reports/api/get-stock';
import { AgingReportView } from '@/features/reports/components/aging-report';
import { DepositsReportView } from '@/features/reports/components/deposits-report';
import { PeriodForm } from '@/features/reports/components/period-form';
import { ReportFrame } from '@/features/reports/components/report-frame';
import { RevenueReportView } from '@/features/reports/components/revenue-report';
import { SalesTaxReportView } from '@/features/reports/components/sales-tax-report';
import { ShortfallsReportView } from '@/features/reports/components/shortfalls-report';
import { StockReportView } from '@/features/reports/components/stock-report';
import { requireArea } from '../../guards';

const TABS = [
  { id: 'aging', label: 'Receivables aging' },
  { id: 'deposits', label: 'Deposits held' },
  { id: 'sales-tax', label: 'Sales tax' },
  { id: 'revenue', label: 'Revenue' },
  { id: 'stock', label: 'Stock and payback' },
  { id: 'shortfalls', label: 'Shortfalls' },
] as const;
type Tab = (typeof TABS)[number]['id'];

const tabOf = (params: URLSearchParams): Tab => {
  const t = params.get('tab');
  return TABS.some((x) => x.id === t) ? (t as Tab) : 'aging';
};

/** The query each tab reads from the address, so a report can be bookmarked and shared. */
function queryOf(tab: Tab, p: URLSearchParams) {
  const s = (k: string) => p.get(k) || undefined;
  switch (tab) {
    case 'aging':
    case 'deposits':
      return { at: s('at') };
    case 'revenue': {
      const year = Number(p.get('year'));
      return { year: Number.isInteger(year) && year > 0 ? year : undefined };
    }
    default:
      return { from: s('from'), to: s('to') };
  }
}

// The owner's and the bookkeeper's (the server answers 403 to others): prefetch the tab opened.
export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'reports');
  const params = new URL(request.url).searchParams;
  const tab = tabOf(params);
  const q = queryOf(tab, params);
  const prefetch = {
    aging: () => queryClient.prefetchQuery(agingQueryOptions(q as { at?: string })),
    deposits: () => queryClient.prefetchQuery(depositsQueryOptions(q as { at?: string })),
    'sales-tax': () => queryClient.prefetchQuery(salesTaxQueryOptions(q as { from?: string; to?: string })),
    revenue: () => queryClient.prefetchQuery(revenueQueryOptions(q as { year?: number })),
    stock: () => queryClient.prefetchQuery(stockQueryOptions(q as { from?: string; to?: string })),
    shortfalls: () => queryClient.prefetchQuery(shortfallsQueryOptions(q as { from?: string; to?: string })),
  }[tab];
  void prefetch();
  return null;
};

const fieldErrors = (error: unknown) => (isApiError(error) && error.status === 400 ? error.fields : undefined);

export default function ReportsRoute() {
  const [params, setParams] = useSearchParams();
  const tab = tabOf(params);
  const apply = (values: Record<string, string>) => setParams({ tab, ...values });
  const current = TABS.find((t) => t.id === tab)!;

  return (
    <>
      <PageHeader
        title="Reports"
        documentTitle={`${current.label} · Reports`}
        description="What to chase, what is held, what is owed to the state, what was earned and what to buy. Every figure opens the invoices or ledger entries it is made of."
      />
      <nav aria-label="Reports" className="mb-6 border-b border-canvas-200">
        <ul className="-mb-px flex flex-wrap gap-x-1">
          {TABS.map((t) => (
            <li key={t.id}>
              <Link
                to={paths.app.reports.getHref(t.id)}
                aria-current={t.id === tab ? 'page' : undefined}
                className={cn(
                  'inline-block border-b-2 px-3 py-2 text-sm font-semibold',
                  t.id === tab ? 'border-pine-700 text-pine-800' : 'border-transparent text-canvas-700 hover:border-canvas-300 hover:text-canvas-900',
                )}
              >
                {t.label}
              </Link>
            </li>
          ))}
        </ul>
      </nav>
      {tab === 'aging' ? <AgingTab params={params} apply={apply} /> : null}
      {tab === 'deposits' ? <DepositsTab params={params} apply={apply} /> : null}
      {tab === 'sales-tax' ? <SalesTaxTab params={params} apply={apply} /> : null}
      {tab === 'revenue' ? <RevenueTab params={params} apply={apply} /> : null}
      {tab === 'stock' ? <StockTab params={params} apply={apply} /> : null}
      {tab === 'shortfalls' ? <ShortfallsTab params={params} apply={apply} /> : null}
    </>
  );
}

interface TabProps {
  params: URLSearchParams;
  apply: (values: Record<string, string>) => void;
}

function AgingTab({ params, apply }: TabProps) {
  const q = queryOf('aging', params) as { at?: string };
  const report = useAging(q);
  return (
    <>
      <PeriodForm
        label="Aging date"
        fields={[{ name: 'at', label: 'As of', type: 'date', hint: 'End of this day; today when empty.' }]}
        values={{ at: q.at ?? report.data?.at ?? '' }}
        schema={AtDateQuery}
        serverErrors={fieldErrors(report.error)}
        onApply={apply}
      />
      <ReportFrame query={report} loadingLabel="Loading the aging…">
        {(data) => <AgingReportView report={data} />}
      </ReportFrame>
    </>
  );
}

function DepositsTab({ params, apply }: TabProps) {
  const q = queryOf('deposits', params) as { at?: string };
  const report = useDeposits(q);
  return (
    <>
      <PeriodForm
        label="Deposits date"
        fields={[{ name: 'at', label: 'As of', type: 'date', hint: 'End of this day; today when empty.' }]}
        values={{ at: q.at ?? report.data?.at ?? '' }}
        schema={AtDateQuery}
        serverErrors={fieldErrors(report.error)}
        onApply={apply}
      />
      <ReportFrame query={report} loadingLabel="Loading the deposits held…">
        {(data) => <DepositsReportView report={data} />}
      </ReportFrame>
    </>
  );
}

function SalesTaxTab({ params, apply }: TabProps) {
  const q = queryOf('sales-tax', params) as { from?: string; to?: string };
  const report = useSalesTax(q);
  return (
    <>
      <PeriodForm
        label="Sales tax months"
        fields={[
          { name: 'from', label: 'First month', type: 'month', hint: 'YYYY-MM' },
          { name: 'to', label: 'Last month', type: 'month', hint: 'YYYY-MM' },
        ]}
        values={{ from: q.from ?? report.data?.from ?? '', to: q.to ?? report.data?.to ?? '' }}
        schema={MonthRangeQuery}
        serverErrors={fieldErrors(report.error)}
        onApply={apply}
      />
      <ReportFrame query={report} loadingLabel="Loading the sales tax…">
        {(data) => <SalesTaxReportView report={data} />}
      </ReportFrame>
    </>
  );
}

function RevenueTab({ params, apply }: TabProps) {
  const q = queryOf('revenue', params) as { year?: number };
  const report = useRevenue(q);
  return (
    <>
      <PeriodForm
        label="Revenue year"
        fields={[{ name: 'year', label: 'Year', type: 'number', hint: 'Compared with the year before.' }]}
        values={{ year: String(q.year ?? report.data?.year ?? '') }}
        schema={RevenueQuery}
        serverErrors={fieldErrors(report.error)}
        onApply={apply}
      />
      <ReportFrame query={report} loadingLabel="Loading the revenue…">
        {(data) => <RevenueReportView report={data} />}
      </ReportFrame>
    </>
  );
}

const periodFields = [
  { name: 'from', label: 'From', type: 'date' as const },
  { name: 'to', label: 'To', type: 'date' as const, hint: 'Both days included.' },
];

function StockTab({ params, apply }: TabProps) {
  const q = queryOf('stock', params) as { from?: string; to?: string };
  const report = useStock(q);
  return (
    <>
      <PeriodForm
        label="Stock period"
        fields={periodFields}
        values={{ from: q.from ?? report.data?.from ?? '', to: q.to ?? report.data?.to ?? '' }}
        schema={PeriodQuery}
        serverErrors={fieldErrors(report.error)}
        onApply={apply}
      />
      <ReportFrame query={report} loadingLabel="Loading the stock report…">
        {(data) => <StockReportView report={data} />}
      </ReportFrame>
    </>
  );
}

function ShortfallsTab({ params, apply }: TabProps) {
  const q = queryOf('shortfalls', params) as { from?: string; to?: string };
  const report = useShortfalls(q);
  return (
    <>
      <PeriodForm
        label="Shortfalls period"
        fields={periodFields}
        values={{ from: q.from ?? report.data?.from ?? '', to: q.to ?? report.data?.to ?? '' }}
        schema={PeriodQuery}
        serverErrors={fieldErrors(report.error)}
        onApply={apply}
      />
      <ReportFrame query={report} loadingLabel="Loading the shortfalls…">
        {(data) => <ShortfallsReportView report={data} />}
      </ReportFrame>
    </>
  );
}
