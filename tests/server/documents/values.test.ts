import { describe, expect, it } from 'vitest';
import { bookingDocumentValues, loadDefaultClauses, parseClauseFile } from '../../../server/documents';
import { issuedAt, organization, rules, sampleBooking, sampleValues } from './fixtures';

describe('bookingDocumentValues', () => {
  it('formats dates and times in the company time zone and money in its currency', () => {
    const v = sampleValues('receipt');
    // 2027-06-12T19:00Z is 2:00 PM in Chicago (CDT is UTC-5 in June; US DST runs March-November,
    // 15 U.S.C. §260a); June 12, 2027 is a Saturday.
    expect(v.booking.eventStart).toBe('Saturday, June 12, 2027, 2:00 PM');
    // Ends 03:00Z on the 13th, still the 12th in Chicago: the date is said once.
    expect(v.booking.eventWindow).toBe('Saturday, June 12, 2027, 2:00 PM – 10:00 PM');
    expect(v.booking.pickupWindow).toBe('Sunday, June 13, 2027, 10:00 AM – 2:00 PM');
    expect(v.booking.deliveryWindow).toBe('Friday, June 11, 2027, 9:00 AM – 1:00 PM');
    expect(v.document.issuedDate).toBe('Tuesday, April 20, 2027');
    expect(v.totals.total).toBe('$2,126.62');
    expect(v.totals.taxRate).toBe('8.25%');
    expect(v.lines[2]).toEqual({ description: '8-ft banquet table', quantity: '10', unitPrice: '$12.00', extraDays: '1 × $4.00', total: '$160.00' });
    expect(v.schedule.map((s) => s.dueDate)).toEqual(['Tuesday, April 20, 2027', 'Saturday, June 5, 2027', 'Saturday, June 5, 2027']);
    expect(v.payment).toMatchObject({ amount: '$500.00', method: 'Check', receivedAt: 'Thursday, April 22, 2027, 11:05 AM' });
    expect(v.rules.windLimitMph).toBe('40');
    expect(v.company.address).toBe('410 Millrace Road, Unit 3, Fernhollow, IL 61999, US');
    expect(v.document.label).toBe('Receipt RC-2027-0107 · version 2');
    expect(v.summary.find((s) => s.label === 'Total')).toEqual({ label: 'Total', amount: '$2,126.62', strong: true });
    expect(v.summary.some((s) => s.label === 'Discounts')).toBe(false);
  });

  it('refuses a booking without totals', () => {
    const booking = { ...sampleBooking(), totals: null };
    expect(() =>
      bookingDocumentValues({ booking, organization, rules, document: { kind: 'invoice', number: 'X', version: 1, issuedAt } }),
    ).toThrow(/no totals/);
  });
});

describe('the clause library', () => {
  const clauses = loadDefaultClauses();

  it('ships the clauses the issue asks for, in order, with initials on utilities, weather, damage and cancellation', () => {
    expect(clauses.map((c) => c.key)).toEqual([
      'rented-items', 'delivery-and-site', 'buried-utilities', 'weather-and-wind', 'damage-and-loss', 'fire-safety',
      'electrical', 'occupancy', 'cancellation', 'payment-terms', 'liability', 'general',
    ]);
    expect(clauses.filter((c) => c.requiresInitials).map((c) => c.key)).toEqual(['buried-utilities', 'weather-and-wind', 'damage-and-loss', 'cancellation']);
    const positions = clauses.map((c) => c.position);
    expect([...positions].sort((a, b) => a - b)).toEqual(positions);
  });

  it('carries the safety points and defers to the code and licensed trades', () => {
    const body = (key: string) => clauses.find((c) => c.key === key)!.body;
    expect(body('buried-utilities')).toContain('811');
    expect(body('buried-utilities')).toMatch(/sprinkler/);
    expect(body('buried-utilities')).toMatch(/septic/);
    expect(body('buried-utilities')).toMatch(/written permission/);
    expect(body('weather-and-wind')).toContain('{{rules.windLimitMph}}');
    expect(body('fire-safety')).toMatch(/fire code/);
    expect(body('fire-safety')).toMatch(/manufacturer/);
    expect(body('fire-safety')).toMatch(/flame-resistance/);
    expect(body('electrical')).toMatch(/licensed electrician/);
    expect(body('electrical')).toMatch(/GFCI/);
    expect(body('occupancy')).toContain('{{#each occupancy}}');
  });

  it('reads front matter and rejects a file without it', () => {
    expect(parseClauseFile('5-extra.md', '---\ntitle: "Extra"\ninitials: true\n---\nBody {{customer.name}}\n')).toEqual({
      key: 'extra', title: 'Extra', body: 'Body {{customer.name}}', requiresInitials: true, position: 5,
    });
    expect(() => parseClauseFile('5-extra.md', 'No front matter')).toThrow(/front matter/);
    expect(() => parseClauseFile('extra.md', '---\ntitle: x\n---\n')).toThrow(/position/);
  });
});
