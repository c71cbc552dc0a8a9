import { createContext, useContext } from 'react';
import type { AgingInvoice, EntriesTrace, ShortfallRequest } from '@shared/schemas/reports';

/** What a figure opens: the journal entries its trace names, the invoices or bookings it is summed from, or the refused requests. */
export type Behind =
  | { kind: 'entries'; title: string; trace: EntriesTrace; cents: number }
  | { kind: 'invoices'; title: string; invoices: AgingInvoice[]; cents: number }
  | { kind: 'bookings'; title: string; itemId: string; from: string; to: string }
  | { kind: 'requests'; title: string; requests: ShortfallRequest[] };

export interface TraceContextValue {
  currency: string;
  timeZone: string;
  open: (behind: Behind) => void;
}

export const TraceContext = createContext<TraceContextValue | null>(null);

/** For figures inside a report: opens the drawer that lists what is behind them. */
export function useTrace(): TraceContextValue {
  const value = useContext(TraceContext);
  if (!value) throw new Error('Figures are shown inside <ReportFrame>.');
  return value;
}
