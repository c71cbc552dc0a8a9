import { describe, expect, it } from 'vitest';
import { DOCUMENT_KINDS, loadDefaultClauses, loadDefaultTemplate, renderDocument, renderPdf, type DocumentKind } from '../../../server/documents';
import { issuedAt, NUMBERS, organization, sampleValues } from './fixtures';
import { flat, pdffonts, pdfjsText, qpdfCheck } from './pdfTools';

const clauses = loadDefaultClauses();

async function render(kind: DocumentKind) {
  const values = sampleValues(kind);
  const doc = await renderDocument({ template: loadDefaultTemplate(kind), clauses, values, company: { name: organization.name }, issuedAt });
  return { values, ...doc };
}

/**
 * The sample booking's total, worked by hand from the fixture's prices and the default rules:
 * rental 895 + 4 x 45 + 10 x (12 + 4) + 80 x 2.50 + 2 x 60 = 1,555.00; delivery 12 mi -> the
 * 25-mi band, 125.00; set-up 150.00; damage waiver 10% of 1,555.00 = 155.50; tax 8.25% of the
 * taxable lines and waiver (1,710.50) = 141.116 -> 141.12; total 1,985.50 + 141.12 = 2,126.62.
 */
const HAND_TOTAL = '$2,126.62';

describe.each(DOCUMENT_KINDS)('the default %s as a PDF', (kind) => {
  it('passes qpdf --check, embeds every font, and holds the booking, the customer, the totals and page numbers', async () => {
    const { pdf, values, sha256 } = await render(kind);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(sha256).toMatch(/^[0-9a-f]{64}$/);

    const check = await qpdfCheck(pdf);
    expect(check.code, check.output).toBe(0);

    const fonts = await pdffonts(pdf);
    expect(fonts.length).toBeGreaterThan(0);
    for (const font of fonts) {
      expect(font.emb, `${font.name} is not embedded`).toBe('yes');
      expect(font.name).toMatch(/IBMPlexSans/);
    }

    const { pages, info } = await pdfjsText(pdf);
    const text = flat(pages.join('\n'));
    expect(text).toContain(values.customer.name);
    expect(text).toContain('B-1042');
    expect(text).toContain(NUMBERS[kind]);
    expect(text).toContain(HAND_TOTAL);
    expect(text).toContain(organization.name);
    expect(flat(pages[0])).toContain(`Page 1 of ${pages.length}`);
    expect(flat(pages[pages.length - 1])).toContain(`Page ${pages.length} of ${pages.length}`);
    expect(info.Title).toBe(`${values.document.title} ${NUMBERS[kind]}`);
    expect(info.Author).toBe(organization.name);
    expect(info.Creator).toBe('Guyline');
  });
});

describe('the rental agreement PDF', () => {
  it('holds every clause title, an initials mark for each clause that asks for one, and both signature blocks', async () => {
    const { pdf } = await render('rental_agreement');
    const { pages } = await pdfjsText(pdf);
    const text = flat(pages.join('\n'));
    clauses.forEach((clause, i) => expect(text).toContain(`${i + 1}. ${clause.title}`));
    const initialed = clauses.filter((c) => c.requiresInitials).length;
    expect(initialed).toBe(4);
    expect(text.split("Customer's initials").length - 1).toBe(initialed);
    expect(text).toContain('For the company');
    expect(text).toContain('Printed name');
    // The wind limit from the company's rules reached the weather clause.
    expect(text).toContain('reach, 40 mph');
    expect(text).toContain('811');
    expect(pages.length).toBeGreaterThan(2);
  });

  it('gives the same bytes for the same input and issue time', async () => {
    const a = await render('rental_agreement');
    const b = await render('rental_agreement');
    expect(b.sha256).toBe(a.sha256);
  });
});

describe('renderPdf', () => {
  it('lays out emphasis, lists, a long table over page breaks and a logo, with embedded fonts only', async () => {
    const rows = Array.from({ length: 90 }, (_, i) => `| Folding chair, row ${i + 1} | ${i + 1} | $${(i + 1) * 2}.50 |`).join('\n');
    const markdown = [
      '# A long list',
      'Plain, **bold**, *italic* and ***both***, with a [link](https://example.com) and AT&amp;T.',
      '1. first\n2. second\n   - nested',
      '> a quoted note',
      '| Item | Qty | Price |\n| --- | ---: | ---: |\n' + rows,
      '```guyline-initials\n{"key":"extra","label":"Customer\'s initials"}\n```',
      '```guyline-signature\n{"parties":[{"role":"Customer","name":"Juniper Hollowell"}]}\n```',
    ].join('\n\n');
    // A 1x1 PNG (the smallest valid PNG; PNG spec, ISO/IEC 15948).
    const logo = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');
    const pdf = await renderPdf({ markdown, title: 'Test', company: { name: organization.name, logo }, documentLabel: 'Test document' });
    expect((await qpdfCheck(pdf)).code).toBe(0);
    const fonts = await pdffonts(pdf);
    expect(fonts.map((f) => f.emb)).toEqual(fonts.map(() => 'yes'));
    expect(fonts.some((f) => /Italic/.test(f.name))).toBe(true);
    expect(fonts.some((f) => /BoldItalic/.test(f.name))).toBe(true);
    const { pages } = await pdfjsText(pdf);
    expect(pages.length).toBeGreaterThan(1);
    // The table header is repeated at the top of the next page.
    expect(flat(pages[1])).toContain('Item Qty Price');
    const text = flat(pages.join('\n'));
    expect(text).toContain('AT&T');
    expect(text).toContain('Folding chair, row 90');
    expect(text).toContain("Customer's initials");
  });

  it('writes no standard-14 font even for an empty document', async () => {
    const pdf = await renderPdf({ markdown: '', title: 'Empty', company: { name: 'X' }, documentLabel: 'Empty' });
    const fonts = await pdffonts(pdf);
    expect(fonts.length).toBeGreaterThan(0);
    for (const f of fonts) {
      expect(f.emb).toBe('yes');
      expect(f.name).not.toMatch(/Helvetica|Times|Courier|Symbol|Dingbats/);
    }
  });
});
