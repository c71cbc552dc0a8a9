import { formatMoney } from '@shared/money';

/** Money for people, in the company's currency; a minus sign for what lowers a figure. */
export const moneyIn = (currency: string) => (cents: number) => formatMoney(cents, currency);

/** Basis points as a percentage with two decimals at most: 725 -> "7.25%", 887.5 -> "8.875%". */
export function percentFromBp(bp: number): string {
  const pct = bp / 100;
  return `${Number(pct.toFixed(3))}%`;
}

const MONTH_NAMES = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const MONTH_LONG = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** "2027-03" -> "Mar 2027" (short) or "March 2027". */
export function monthText(month: string, long = false): string {
  const [y, m] = month.split('-').map(Number);
  return `${(long ? MONTH_LONG : MONTH_NAMES)[m - 1]} ${y}`;
}

export const shortMonth = (index: number) => MONTH_NAMES[index];
export const longMonth = (index: number) => MONTH_LONG[index];

/** "invoice_issued" -> "Invoice issued". */
export const kindText = (kind: string) => {
  const words = kind.replaceAll('_', ' ').trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
};

/** Utilization for people: "13.64%", or a dash when nothing was owned. */
export const utilizationText = (bp: number | null) => (bp === null ? '—' : `${(bp / 100).toFixed(2)}%`);

/**
 * Chart colours from the app's palette, dark enough against white for graphics (3:1, WCAG 2.2
 * 1.4.11); the tables beside the charts carry the same figures in text.
 */
export const CHART_COLORS = {
  pine: '#194f46',
  pineMid: '#2d7a6b',
  ochre: '#936410',
  copper: '#b5651d',
  rust: '#a6412b',
  rustDark: '#6e291c',
  canvas: '#857a64',
  grid: '#e6dfd0',
  text: '#4d463a',
} as const;

/** Axis ticks in whole currency units: "$1.2k" for 120,000 cents. */
export function compactMoney(cents: number, currency: string): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency, notation: 'compact', maximumFractionDigits: 1 }).format(cents / 100);
}
