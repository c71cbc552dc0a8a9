/**
 * The PDF's fonts, colours and inline text: Markdown inline tokens flattened to runs of
 * regular, bold and italic text and written with pdfkit's continued text.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Token } from 'marked';

export const fontsDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'fonts');

/**
 * The faces the PDF embeds, by file path. The path is also the name pdfkit caches the font
 * under, so the face given to the constructor (which keeps pdfkit from loading Helvetica, a
 * standard-14 font that would not be embedded) is the same object as the regular face.
 */
export const FONTS = {
  regular: path.join(fontsDir, 'ibm-plex-sans-latin-400-normal.woff'),
  italic: path.join(fontsDir, 'ibm-plex-sans-latin-400-italic.woff'),
  semibold: path.join(fontsDir, 'ibm-plex-sans-latin-600-normal.woff'),
  bold: path.join(fontsDir, 'ibm-plex-sans-latin-700-normal.woff'),
  boldItalic: path.join(fontsDir, 'ibm-plex-sans-latin-700-italic.woff'),
};

export const COLORS = {
  ink: '#1f2a24',
  muted: '#5b665f',
  rule: '#c3ccc6',
  band: '#edf1ee',
  accent: '#2f5d50',
};

export interface Run {
  text: string;
  bold: boolean;
  italic: boolean;
  link?: string;
}

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'", nbsp: ' ', '#39': "'" };

/** marked leaves character references in text as written; the PDF shows the characters. */
export function decodeEntities(s: string): string {
  return s.replace(/&(#x[0-9a-f]+|#\d+|[a-z]+\d*);/gi, (whole, name: string) => {
    if (name[0] === '#') {
      const code = name[1] === 'x' || name[1] === 'X' ? parseInt(name.slice(2), 16) : parseInt(name.slice(1), 10);
      return Number.isFinite(code) && code > 0 && code <= 0x10ffff ? String.fromCodePoint(code) : whole;
    }
    return ENTITIES[name.toLowerCase()] ?? whole;
  });
}

const SAFE_LINK = /^(https?:|mailto:|tel:)/i;

/** Inline tokens to runs; raw HTML and images are left out of the PDF. */
export function inlineRuns(tokens: Token[] | undefined, style: { bold: boolean; italic: boolean; link?: string } = { bold: false, italic: false }): Run[] {
  const runs: Run[] = [];
  for (const t of tokens ?? []) {
    const tok = t as Token & { tokens?: Token[]; text?: string; href?: string };
    switch (tok.type) {
      case 'strong':
        runs.push(...inlineRuns(tok.tokens, { ...style, bold: true }));
        break;
      case 'em':
        runs.push(...inlineRuns(tok.tokens, { ...style, italic: true }));
        break;
      case 'del':
        runs.push(...inlineRuns(tok.tokens, style));
        break;
      case 'link':
        runs.push(...inlineRuns(tok.tokens, { ...style, link: tok.href && SAFE_LINK.test(tok.href) ? tok.href : undefined }));
        break;
      case 'br':
        runs.push({ text: '\n', ...style });
        break;
      case 'codespan':
        runs.push({ text: tok.text ?? '', ...style });
        break;
      case 'escape':
        runs.push({ text: tok.text ?? '', ...style });
        break;
      case 'text':
        if (tok.tokens?.length) runs.push(...inlineRuns(tok.tokens, style));
        else runs.push({ text: decodeEntities(tok.text ?? ''), ...style });
        break;
      case 'html':
      case 'image':
        break;
      default:
        if (tok.tokens) runs.push(...inlineRuns(tok.tokens, style));
        else if (typeof tok.text === 'string') runs.push({ text: decodeEntities(tok.text), ...style });
    }
  }
  return runs.filter((r) => r.text !== '');
}

export const plainText = (runs: Run[]) => runs.map((r) => r.text).join('');

export function fontFor(run: { bold: boolean; italic: boolean }, base: 'regular' | 'semibold' = 'regular'): string {
  if (run.bold && run.italic) return FONTS.boldItalic;
  if (run.bold) return FONTS.bold;
  if (run.italic) return FONTS.italic;
  return FONTS[base];
}

export interface RunOptions {
  x: number;
  width: number;
  size: number;
  color?: string;
  base?: 'regular' | 'semibold';
  align?: 'left' | 'right' | 'center';
  lineGap?: number;
}

/**
 * Writes runs as one paragraph starting at (x, doc.y); pdfkit breaks lines and pages. Hard line
 * breaks end one chain of continued text and start the next: pdfkit's continued text drops or
 * misplaces a newline inside the chain.
 */
export function writeRuns(doc: PDFKit.PDFDocument, runs: Run[], o: RunOptions): void {
  const lines: Run[][] = [[]];
  for (const run of runs) {
    run.text.split('\n').forEach((piece, i) => {
      if (i > 0) lines.push([]);
      if (piece) lines[lines.length - 1].push({ ...run, text: piece });
    });
  }
  for (const line of lines) {
    if (line.length === 0) {
      doc.font(FONTS.regular).fontSize(o.size);
      doc.y += doc.currentLineHeight(true) + (o.lineGap ?? 2);
      continue;
    }
    line.forEach((run, i) => {
      doc.font(fontFor(run, o.base)).fontSize(o.size).fillColor(run.link ? COLORS.accent : (o.color ?? COLORS.ink));
      const options: PDFKit.Mixins.TextOptions = {
        continued: i < line.length - 1,
        link: run.link ?? null,
        underline: Boolean(run.link),
      };
      if (i === 0) doc.text(run.text, o.x, doc.y, { ...options, width: o.width, align: o.align ?? 'left', lineGap: o.lineGap ?? 2 });
      else doc.text(run.text, options);
    });
  }
  doc.fillColor(COLORS.ink);
}
