import { z } from 'zod';

/** Money in integer minor units (cents). */
export const Cents = z
  .number({ error: 'Enter an amount.' })
  .int('Amounts are whole cents.')
  .min(0, 'Amounts cannot be negative.')
  .max(100_000_000_00, 'That amount is too large.');

/** A percentage in basis points (1% = 100 bp), whole. */
export const Bp = z.number({ error: 'Enter a percentage.' }).int('Use whole basis points.').min(0, 'Percentages cannot be negative.').max(10_000, 'At most 100%.');

/** A tax rate in basis points, to a hundredth of a basis point (8.875% = 887.5 bp). */
export const TaxRateBp = z
  .number({ error: 'Enter the tax rate.' })
  .min(0, 'The tax rate cannot be negative.')
  .max(3000, 'A sales tax rate above 30% is not plausible.')
  .refine((n) => Math.abs(Math.round(n * 100) - n * 100) < 1e-6, 'Use at most two decimals of a basis point.');

export const Id = z.uuid({ error: 'Not a valid id.' });
export const IdParams = z.object({ id: Id });

/** An instant as an ISO 8601 string with a time zone, e.g. 2027-06-12T14:00:00-05:00. */
export const Instant = z.iso.datetime({ offset: true, error: 'Enter a date and time.' });
/** A calendar date, YYYY-MM-DD. */
export const DateOnly = z.iso.date({ error: 'Enter a date as YYYY-MM-DD.' });

export const ListQuery = z.object({
  page: z.coerce.number({ error: 'Page must be a number.' }).int().min(1, 'Pages start at 1.').default(1),
  pageSize: z.coerce.number({ error: 'Page size must be a number.' }).int().min(1).max(200, 'At most 200 a page.').default(50),
});
export type ListQuery = z.infer<typeof ListQuery>;

export interface ListResponse<T> {
  data: T[];
  total: number;
}
