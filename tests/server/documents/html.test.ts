import { describe, expect, it } from 'vitest';
import { loadDefaultClauses, loadDefaultTemplate, markdownToHtml, renderDocumentMarkdown } from '../../../server/documents';
import { sampleValues } from './fixtures';

describe('markdownToHtml', () => {
  it('strips scripts, event handlers, javascript: links and outside images from a malicious template', () => {
    const template = [
      '# Invoice {{document.number}}',
      '<script>alert("x")</script>',
      '<img src="https://tracker.example/pixel.png" onerror="alert(1)">',
      '<p onmouseover="steal()">Hover</p>',
      '[pay here](javascript:alert(2)) <a href="https://example.com" onclick="x()">ok</a>',
      '<iframe src="https://example.com"></iframe><style>body{display:none}</style>',
    ].join('\n\n');
    const html = markdownToHtml(renderDocumentMarkdown(template, sampleValues('invoice'), []));
    expect(html).toContain('<h1>Invoice INV-2027-0042</h1>');
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toContain('alert(');
    expect(html).not.toMatch(/\bon[a-z]+=/i);
    expect(html).not.toContain('javascript:');
    expect(html).not.toContain('tracker.example');
    expect(html).not.toMatch(/<iframe|<style/i);
    expect(html).toContain('<p>Hover</p>');
    expect(html).toContain('href="https://example.com"');
  });

  it('turns the blocks into HTML and escapes what a hand-written block holds', () => {
    const html = markdownToHtml(
      [
        '```guyline-table',
        '{"columns":[{"label":"<script>x()</script>","align":"left"},{"label":"Amount","align":"right"}],"rows":[["Tent","$1.00"]],"totals":[{"label":"Total","amount":"$1.00","strong":true}]}',
        '```',
        '',
        '```guyline-initials',
        '{"key":"weather\\" onclick=\\"x()","label":"Initials"}',
        '```',
      ].join('\n'),
    );
    expect(html).toContain('<table class="line-items">');
    expect(html).toContain('&lt;script&gt;x()&lt;/script&gt;');
    expect(html).toContain('<td class="num">$1.00</td>');
    expect(html).toContain('<tr class="total strong">');
    expect(html).toMatch(/<div class="initials" data-clause="weather&quot; onclick=&quot;x\(\)">/);
    expect(html).not.toMatch(/<script/);
  });

  it('renders the default agreement with the line items, the initials boxes and the signature block', () => {
    const html = markdownToHtml(renderDocumentMarkdown(loadDefaultTemplate('rental_agreement'), sampleValues('rental_agreement'), loadDefaultClauses()));
    expect(html).toContain('<table class="line-items">');
    for (const key of ['buried-utilities', 'weather-and-wind', 'damage-and-loss', 'cancellation']) expect(html).toContain(`data-clause="${key}"`);
    expect(html.match(/class="initials"/g)).toHaveLength(4);
    expect(html).toContain('<div class="signatures">');
    expect(html).toContain('Juniper Hollowell');
  });
});
