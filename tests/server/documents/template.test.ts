import { describe, expect, it } from 'vitest';
import {
  DOCUMENT_KINDS,
  DOCUMENT_VARIABLES,
  loadDefaultClauses,
  loadDefaultEmailTemplate,
  loadDefaultTemplate,
  markdownToHtml,
  renderDocumentEmail,
  renderDocumentMarkdown,
  TemplateError,
  validateEmailTemplate,
  validateTemplate,
  type Clause,
} from '../../../server/documents';
import { sampleBooking, sampleValues } from './fixtures';

const variables = DOCUMENT_VARIABLES;
const errorsOf = (source: string, context?: 'document' | 'clause' | 'email') => {
  const result = validateTemplate(source, { variables, context });
  return result.ok ? [] : result.errors;
};

describe('validateTemplate', () => {
  it('names an unknown variable and its line', () => {
    const source = ['# Rental agreement', '', 'Between {{company.name}}', 'and {{customer.nmae}}.', ''].join('\n');
    const errors = errorsOf(source);
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatchObject({ line: 4, column: 7, variable: 'customer.nmae', message: 'unknown variable customer.nmae' });
  });

  it('resolves names inside #each against the list items, and reports a field they lack on its line', () => {
    const source = ['{{#each lines}}', '- {{description}}: {{quantity}} at {{unitPrice}}', '- {{prise}}', '{{/each}}'].join('\n');
    const errors = errorsOf(source);
    expect(errors).toEqual([expect.objectContaining({ line: 3, variable: 'prise' })]);
    expect(errors[0].message).toContain('unknown variable prise');
  });

  it('allows ../, @root, @index and #with, and rejects what is not a value', () => {
    expect(errorsOf('{{#each schedule}}{{@index}} {{label}} {{../customer.name}} {{@root.booking.reference}}{{/each}}')).toEqual([]);
    expect(errorsOf('{{#with company}}{{name}}, {{city}}{{/with}}')).toEqual([]);
    const errors = errorsOf(['{{company}}', '{{lines}}', '{{shout customer.name}}', '{{> footer}}', '{{@index}}'].join('\n'));
    expect(errors.map((e) => e.line)).toEqual([1, 2, 3, 4, 5]);
    expect(errors[2].message).toBe('unknown helper shout');
  });

  it('reports a syntax error on the line of the bad token', () => {
    const source = ['# Invoice', '', 'Bill to:', '{{customer.name}', 'Thank you.'].join('\n');
    const errors = errorsOf(source);
    expect(errors).toHaveLength(1);
    expect(errors[0].line).toBe(4);
    expect(errors[0].message).toMatch(/^syntax error/);
  });

  it('reports a block closed by the wrong helper, and one never closed', () => {
    expect(errorsOf(['a', '{{#if customer.email}}', 'x', '{{/each}}'].join('\n'))[0]).toMatchObject({ line: 2 });
    const unclosed = errorsOf(['a', '{{#each lines}}', '{{description}}'].join('\n'));
    expect(unclosed[0].line).toBe(3);
    expect(unclosed[0].message).toContain('missing');
  });

  it('checks helper arguments and where helpers may be used', () => {
    expect(errorsOf('{{initials "weather"}} {{lineItems}} {{signatureBlock}} {{clauses}} {{upper customer.name}}')).toEqual([]);
    expect(errorsOf('{{initials}}')[0].message).toContain('takes 1 argument');
    expect(errorsOf('{{clauses}}', 'clause')[0].message).toBe('{{clauses}} is not available in a clause');
    expect(errorsOf('{{lineItems}}', 'email')).toEqual([expect.objectContaining({ line: 1, message: '{{lineItems}} is not available in an e-mail' })]);
  });

  it('passes every shipped template, clause and e-mail', () => {
    for (const kind of DOCUMENT_KINDS) {
      expect(validateTemplate(loadDefaultTemplate(kind), { variables }), kind).toEqual({ ok: true });
      expect(validateEmailTemplate(loadDefaultEmailTemplate(kind)), `email ${kind}`).toEqual({ ok: true });
    }
    for (const clause of loadDefaultClauses()) {
      expect(validateTemplate(clause.body, { variables, context: 'clause' }), clause.key).toEqual({ ok: true });
    }
  });

  it('lists every value bookingDocumentValues produces, and nothing it does not', () => {
    const values = sampleValues('receipt') as unknown as Record<string, unknown>;
    const paths = new Set<string>();
    const walk = (v: unknown, prefix: string) => {
      if (Array.isArray(v)) {
        paths.add(prefix);
        for (const item of v) walk(item, prefix);
      } else if (v && typeof v === 'object') {
        for (const [k, child] of Object.entries(v)) walk(child, prefix ? `${prefix}.${k}` : k);
      } else paths.add(prefix);
    };
    walk(values, '');
    expect([...paths].sort()).toEqual([...variables].sort());
  });
});

describe('renderDocumentMarkdown', () => {
  const clauses = loadDefaultClauses();

  it('renders every default with the sample values', () => {
    for (const kind of DOCUMENT_KINDS) {
      const markdown = renderDocumentMarkdown(loadDefaultTemplate(kind), sampleValues(kind), clauses);
      expect(markdown).toContain('Juniper Hollowell');
      expect(markdown).toContain('```guyline-table');
      expect(markdown).not.toMatch(/\{\{|\}\}/);
    }
  });

  it('places the clauses in position order, with initials blocks for those that ask', () => {
    const own: Clause[] = [
      { key: 'second', title: 'Second', body: 'Wind limit {{rules.windLimitMph}} mph.', requiresInitials: true, position: 20 },
      { key: 'first', title: 'First', body: 'For {{customer.name}}.', requiresInitials: false, position: 10 },
    ];
    const markdown = renderDocumentMarkdown('{{clauses}}', sampleValues('rental_agreement'), own);
    expect(markdown.indexOf('### 1. First')).toBeLessThan(markdown.indexOf('### 2. Second'));
    expect(markdown).toContain('Wind limit 40 mph.');
    expect(markdown).toContain('```guyline-initials\n{"key":"second"');
    expect(markdown).not.toContain('"key":"first"');
  });

  it('lists the occupancy of each tent, and says so when there is no tent', () => {
    const occupancy = clauses.filter((c) => c.key === 'occupancy');
    const withTent = renderDocumentMarkdown('{{clauses}}', sampleValues('rental_agreement'), occupancy);
    expect(withTent).toContain('**20 x 40 ft frame tent**: no more than 53 people');
    const values = { ...sampleValues('rental_agreement'), occupancy: [] };
    expect(renderDocumentMarkdown('{{clauses}}', values, occupancy)).toContain('This booking has no tent.');
  });

  it('throws a TemplateError naming the line of a variable the values lack', () => {
    try {
      renderDocumentMarkdown('line one\n\n{{customer.nmae}}', sampleValues('invoice'), []);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(TemplateError);
      expect((error as TemplateError).errors[0]).toMatchObject({ line: 3, variable: 'nmae' });
    }
  });

  it('keeps Markdown in customer data as literal text', () => {
    const values = sampleValues('invoice', sampleBooking({ customerName: '*Star* [Events](javascript:alert(1)) <b>& Co</b>' }));
    const html = markdownToHtml(renderDocumentMarkdown('Hello {{customer.name}}\n\n{{signatureBlock}}', values, []));
    expect(html).toContain('*Star* [Events](javascript:alert(1)) &lt;b&gt;&amp; Co&lt;/b&gt;');
    expect(html).not.toContain('<em>');
    expect(html).not.toContain('<a ');
    expect(html).not.toContain('<b>');
  });
});

describe('renderDocumentEmail', () => {
  it('splits the subject from a plain-text body, with the link when there is one', () => {
    const values = sampleValues('rental_agreement');
    const mail = renderDocumentEmail(loadDefaultEmailTemplate('rental_agreement'), values, { link: 'https://app.example/sign/abc' });
    expect(mail.subject).toBe('Your rental agreement RA-1042 from Quillbrook Tent & Table Co.');
    expect(mail.text).toContain('Hello Juniper Hollowell,');
    expect(mail.text).toContain('https://app.example/sign/abc');
    expect(mail.html).toContain('<a href="https://app.example/sign/abc">');
    const without = renderDocumentEmail(loadDefaultEmailTemplate('rental_agreement'), values);
    expect(without.text).not.toContain('online here');
  });
});
