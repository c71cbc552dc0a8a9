/**
 * The CSV line writer every export uses, read back by csv-parse as a bookkeeper's tools would.
 * Source of the rules: RFC 4180 ("Common Format and MIME Type for CSV Files") §2 rule 1 (records
 * end in CRLF) and rules 5-7 (a field with a comma, a quote or a line break is enclosed in double
 * quotes, a quote inside doubled). Quoting a field that starts or ends with white space is common
 * practice (spreadsheet programs trim it otherwise), no published source.
 */
import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvLine } from '../../../server/services/exports/csv';

const readBack = (text: string) => parse(text, { relax_column_count: true }) as string[][];

describe('csvLine', () => {
  it('quotes only the fields that need it, and ends the record with CRLF', () => {
    expect(csvLine(['INV-2026-0001', 'Rosalind Oakhurst', '144.79', ''])).toBe('INV-2026-0001,Rosalind Oakhurst,144.79,\r\n');
    expect(csvLine(['Oakhurst, Rosalind', 'Tent "A"', ' padded', 'padded '])).toBe('"Oakhurst, Rosalind","Tent ""A"""," padded","padded "\r\n');
    expect(csvLine([null, undefined, 'x'])).toBe(',,x\r\n');
  });

  it('quotes a line break of any kind inside a field: CRLF, a bare LF, a bare CR', () => {
    // A bare LF or CR left unquoted reads as the end of the record in csv-parse and in
    // spreadsheet programs: the rest of the field would start a row of its own.
    expect(csvLine(['Gate code 4417\r\nSide entrance', 'x'])).toBe('"Gate code 4417\r\nSide entrance",x\r\n');
    expect(csvLine(['Gate code 4417\nSide entrance', 'x'])).toBe('"Gate code 4417\nSide entrance",x\r\n');
    expect(csvLine(['Check 2201\rcopy', 'x'])).toBe('"Check 2201\rcopy",x\r\n');
    expect(readBack(csvLine(['Gate code 4417\nSide entrance', 'x']) + csvLine(['next', 'row']))).toEqual([
      ['Gate code 4417\nSide entrance', 'x'],
      ['next', 'row'],
    ]);
  });

  it('leaves out the fields past the width', () => {
    expect(csvLine(['a', 'b', 'c'], 2)).toBe('a,b\r\n');
  });

  it('reads back to the same fields, whatever the text', () => {
    const text = fc.string({ unit: fc.constantFrom('a', 'Z', '0', ' ', ',', '"', '\r', '\n', '\t', '\u00a0', 'ë', '😀', '=', '-', "'") });
    fc.assert(
      fc.property(fc.array(fc.array(text, { minLength: 2, maxLength: 6 }), { minLength: 1, maxLength: 5 }), (records) => {
        expect(readBack(records.map((r) => csvLine(r)).join(''))).toEqual(records);
      }),
      { numRuns: 500 },
    );
  });
});
