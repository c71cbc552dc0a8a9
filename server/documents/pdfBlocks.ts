/**
 * The blocks of blocks.ts drawn with pdfkit: the line-item table (header repeated after a page
 * break, money right-aligned, totals under it), the initials box and the signature block. A
 * signed copy fills the boxes inside their fixed areas, never moving what comes after them.
 */
import type { InitialsBlock, SignatureBlock, TableBlock } from './blocks';
import { COLORS, FONTS } from './pdfText';

export interface Frame {
  left: number;
  width: number;
}

/** The customer's signature as it goes into the signature block of a signed copy. */
export interface SignatureFill {
  /** The party whose block is filled, by its role as printed (e.g. "Customer"). */
  role: string;
  /** The drawn signature; without it the typed name is written in the signature style. */
  imagePng?: Buffer | null;
  typedName: string;
  /** e.g. "Signed electronically by Juniper Hollowell on April 22, 2027" */
  statement: string;
  /** Written on the date line. */
  date: string;
}

export interface DocumentFill {
  /** Initials by the initials block's key. */
  initials?: Record<string, string>;
  signature?: SignatureFill;
}

/** Ink for what a signer wrote (initials, a typed signature): a pen's blue, not the print's. */
export const SIGNATURE_INK = '#1c3f7a';

const bottom = (doc: PDFKit.PDFDocument) => doc.page.height - doc.page.margins.bottom;

/** Starts a new page unless `height` points fit below the cursor. */
export function ensureSpace(doc: PDFKit.PDFDocument, height: number): void {
  if (doc.y + height > bottom(doc)) doc.addPage();
}

const PAD = 5;
const BODY = 9.5;
const HEAD = 8.5;

/**
 * Every column as wide as its widest cell when that fits, the spare room going to the first
 * (the description) or shared evenly. When it does not fit, narrow columns keep their width and the wide ones
 * share what is left in proportion, wrapping their text.
 */
function columnWidths(doc: PDFKit.PDFDocument, table: TableBlock, width: number, stretch: 'first' | 'even'): number[] {
  const n = Math.max(1, table.columns.length);
  const natural = Array.from({ length: n }, (_, i) => {
    doc.font(FONTS.semibold).fontSize(HEAD);
    let w = doc.widthOfString(table.columns[i]?.label ?? '');
    doc.font(FONTS.regular).fontSize(BODY);
    for (const r of table.rows) w = Math.max(w, doc.widthOfString(r[i] ?? ''));
    return w + PAD * 2 + 1;
  });
  const total = natural.reduce((a, b) => a + b, 0);
  if (total <= width) {
    const spare = width - total;
    return natural.map((w, i) => (stretch === 'even' ? w + spare / n : i === 0 ? w + spare : w));
  }
  const fair = width / n;
  const fixed = natural.filter((w) => w <= fair).reduce((a, b) => a + b, 0);
  const wide = natural.filter((w) => w > fair).reduce((a, b) => a + b, 0);
  return natural.map((w) => (w <= fair ? w : (w * (width - fixed)) / wide));
}

function drawRow(doc: PDFKit.PDFDocument, cells: string[], table: TableBlock, widths: number[], frame: Frame, header: boolean): void {
  const font = header ? FONTS.semibold : FONTS.regular;
  const size = header ? HEAD : BODY;
  doc.font(font).fontSize(size);
  const heights = widths.map((w, i) => doc.heightOfString(cells[i] ?? '', { width: w - PAD * 2, lineGap: 1 }));
  const height = Math.max(...heights, size) + PAD * 2;
  const y = doc.y;
  if (header) doc.rect(frame.left, y, frame.width, height).fill(COLORS.band);
  let x = frame.left;
  widths.forEach((w, i) => {
    const text = cells[i] ?? '';
    if (text) {
      doc
        .font(font)
        .fontSize(size)
        .fillColor(header ? COLORS.muted : COLORS.ink)
        .text(text, x + PAD, y + PAD, { width: w - PAD * 2, align: table.columns[i]?.align ?? 'left', lineGap: 1 });
    }
    x += w;
  });
  doc
    .moveTo(frame.left, y + height)
    .lineTo(frame.left + frame.width, y + height)
    .lineWidth(header ? 0.8 : 0.4)
    .strokeColor(COLORS.rule)
    .stroke();
  doc.x = frame.left;
  doc.y = y + height;
}

function rowHeight(doc: PDFKit.PDFDocument, cells: string[], widths: number[]): number {
  doc.font(FONTS.regular).fontSize(BODY);
  return Math.max(...widths.map((w, i) => doc.heightOfString(cells[i] ?? '', { width: w - PAD * 2, lineGap: 1 })), BODY) + PAD * 2;
}

/** stretch: who gets the spare width, the first column (a description) or every column. */
export function drawTable(doc: PDFKit.PDFDocument, table: TableBlock, frame: Frame, stretch: 'first' | 'even' = 'first'): void {
  const widths = columnWidths(doc, table, frame.width, stretch);
  const header = table.columns.map((c) => c.label);
  // Header plus the first row, so a header never sits alone at the foot of a page.
  ensureSpace(doc, 28 + (table.rows[0] ? rowHeight(doc, table.rows[0], widths) : 0));
  drawRow(doc, header, table, widths, frame, true);
  for (const row of table.rows) {
    if (doc.y + rowHeight(doc, row, widths) > bottom(doc)) {
      doc.addPage();
      drawRow(doc, header, table, widths, frame, true);
    }
    drawRow(doc, row, table, widths, frame, false);
  }
  if (table.totals.length) drawTotals(doc, table, widths, frame);
  doc.x = frame.left;
  doc.y += 10;
}

function drawTotals(doc: PDFKit.PDFDocument, table: TableBlock, widths: number[], frame: Frame): void {
  const amountWidth = Math.max(widths[widths.length - 1], 96);
  const labelWidth = Math.min(frame.width * 0.5, frame.width - amountWidth);
  const right = frame.left + frame.width;
  const lineHeight = BODY + 6.5;
  // The totals stay together when they fit on a page.
  ensureSpace(doc, Math.min(table.totals.length * lineHeight + 8, 400));
  doc.y += 4;
  for (const t of table.totals) {
    ensureSpace(doc, lineHeight);
    const y = doc.y;
    if (t.strong) {
      doc
        .moveTo(right - labelWidth - amountWidth, y)
        .lineTo(right, y)
        .lineWidth(0.8)
        .strokeColor(COLORS.ink)
        .stroke();
    }
    const font = t.strong ? FONTS.bold : FONTS.regular;
    doc.font(font).fontSize(BODY).fillColor(t.strong ? COLORS.ink : COLORS.muted);
    doc.text(t.label, right - labelWidth - amountWidth, y + 4, { width: labelWidth - PAD, align: 'right', lineBreak: false });
    doc.fillColor(COLORS.ink).text(t.amount, right - amountWidth, y + 4, { width: amountWidth - PAD, align: 'right', lineBreak: false });
    doc.y = y + lineHeight;
  }
  doc.x = frame.left;
}

export const INITIALS_BOX = { width: 92, height: 30 };

/** The box itself, its caption inside at the top as on a paper form; on a signed copy, the initials in it. */
export function drawInitialsBox(doc: PDFKit.PDFDocument, block: InitialsBlock, x: number, y: number, initials?: string): void {
  doc.rect(x, y, INITIALS_BOX.width, INITIALS_BOX.height).lineWidth(0.9).strokeColor(COLORS.ink).stroke();
  doc
    .font(FONTS.regular)
    .fontSize(6.5)
    .fillColor(COLORS.muted)
    .text(block.label, x + 4, y + 3, { width: INITIALS_BOX.width - 8, lineBreak: false });
  if (initials) {
    doc
      .font(FONTS.italic)
      .fontSize(14)
      .fillColor(SIGNATURE_INK)
      .text(initials, x + 4, y + 11, { width: INITIALS_BOX.width - 8, align: 'center', lineBreak: false, ellipsis: true });
  }
  doc.fillColor(COLORS.ink);
}

/** An initials box on its own, at the right edge (a clause's box sits beside its heading instead). */
export function drawInitials(doc: PDFKit.PDFDocument, block: InitialsBlock, frame: Frame, initials?: string): void {
  ensureSpace(doc, INITIALS_BOX.height + 10);
  const y = doc.y + 2;
  drawInitialsBox(doc, block, frame.left + frame.width - INITIALS_BOX.width, y, initials);
  doc.x = frame.left;
  doc.y = y + INITIALS_BOX.height + 8;
}

/**
 * The signature itself between the party's heading and the signature line: the drawn image, or
 * the typed name in the italic face, with the statement of electronic signing just above the line.
 */
function drawSignatureMark(doc: PDFKit.PDFDocument, fill: SignatureFill, x: number, top: number, lineY: number, width: number): void {
  // The statement is printed in full: up to three lines for a long name, the mark above it.
  doc.font(FONTS.regular).fontSize(7);
  const statementHeight = Math.min(doc.heightOfString(fill.statement, { width, lineGap: 0.5 }), 28);
  const statementY = lineY - 2 - statementHeight;
  const markBottom = statementY - 2;
  if (fill.imagePng) {
    doc.image(fill.imagePng, x, top, { fit: [width, Math.max(10, markBottom - top)], valign: 'bottom' });
  } else {
    doc.font(FONTS.italic).fontSize(20);
    const size = Math.max(9, Math.min(20, (20 * width) / Math.max(1, doc.widthOfString(fill.typedName)), markBottom - top));
    doc
      .font(FONTS.italic)
      .fontSize(size)
      .fillColor(SIGNATURE_INK)
      .text(fill.typedName, x, markBottom - size * 1.25, { width, lineBreak: false, ellipsis: true });
  }
  doc
    .font(FONTS.regular)
    .fontSize(7)
    .fillColor(COLORS.muted)
    .text(fill.statement, x, statementY, { width, height: statementHeight + 1, lineGap: 0.5, ellipsis: true });
  doc.fillColor(COLORS.ink);
}

/** Side by side: each party's role, a signature line, the typed name and a date line. */
export function drawSignatures(doc: PDFKit.PDFDocument, block: SignatureBlock, frame: Frame, fill?: SignatureFill): void {
  const parties = block.parties.length ? block.parties : [{ role: 'Customer', name: '', onBehalfOf: '' }];
  const gap = 32;
  const perRow = Math.min(2, parties.length);
  const colW = (frame.width - gap * (perRow - 1)) / perRow;
  const height = 150;
  for (let start = 0; start < parties.length; start += perRow) {
    ensureSpace(doc, height);
    const y0 = doc.y + 6;
    parties.slice(start, start + perRow).forEach((p, i) => {
      const x = frame.left + i * (colW + gap);
      const line = (y: number, caption: string) => {
        doc.moveTo(x, y).lineTo(x + colW, y).lineWidth(0.6).strokeColor(COLORS.ink).stroke();
        doc.font(FONTS.regular).fontSize(7.5).fillColor(COLORS.muted).text(caption, x, y + 3, { width: colW, lineBreak: false });
      };
      doc.font(FONTS.semibold).fontSize(10).fillColor(COLORS.ink).text(p.role, x, y0, { width: colW, lineBreak: false });
      if (p.onBehalfOf) doc.font(FONTS.regular).fontSize(9).fillColor(COLORS.muted).text(p.onBehalfOf, x, y0 + 14, { width: colW, lineBreak: false });
      const signed = fill && p.role === fill.role ? fill : undefined;
      if (signed) {
        drawSignatureMark(doc, signed, x, y0 + (p.onBehalfOf ? 28 : 16), y0 + 62, colW);
        doc.font(FONTS.regular).fontSize(10).fillColor(COLORS.ink).text(signed.date, x, y0 + 118, { width: colW, lineBreak: false });
      }
      line(y0 + 62, 'Signature');
      if (p.name) doc.font(FONTS.regular).fontSize(10).fillColor(COLORS.ink).text(p.name, x, y0 + 84, { width: colW, lineBreak: false });
      line(y0 + 98, 'Printed name');
      line(y0 + 132, 'Date');
    });
    doc.fillColor(COLORS.ink);
    doc.x = frame.left;
    doc.y = y0 + height;
  }
}
