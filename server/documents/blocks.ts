/**
 * The blocks Markdown has no words for: the line-item table, an initials box and the signature
 * block. The template helpers write each as a fenced code block whose info string names it and
 * whose body is one line of JSON:
 *
 *     ```guyline-table
 *     {"columns":[...],"rows":[...],"totals":[...]}
 *     ```
 *
 * Markdown keeps a fenced block verbatim, so the block reaches both renderers intact: html.ts
 * turns it into HTML, pdf.ts draws it. The JSON is a single line, so nothing in it can close
 * the fence early. A block written by hand in a template goes through the same checks.
 */

export interface TableColumn {
  label: string;
  align: 'left' | 'right';
}

export interface TableBlock {
  type: 'table';
  columns: TableColumn[];
  rows: string[][];
  totals: { label: string; amount: string; strong: boolean }[];
}

export interface InitialsBlock {
  type: 'initials';
  /** The clause (or any key the template names) the initials belong to. */
  key: string;
  label: string;
}

export interface SignatureParty {
  role: string;
  /** The name typed under the line; empty leaves a line to fill in. */
  name: string;
  /** On whose behalf, e.g. the company for its representative. */
  onBehalfOf: string;
}

export interface SignatureBlock {
  type: 'signature';
  parties: SignatureParty[];
}

export type DocumentBlock = TableBlock | InitialsBlock | SignatureBlock;

export const BLOCK_PREFIX = 'guyline-';

export function blockMarkdown(block: DocumentBlock): string {
  const { type, ...payload } = block;
  // JSON.stringify escapes newlines, so the payload stays on one line inside the fence.
  return `\n\`\`\`${BLOCK_PREFIX}${type}\n${JSON.stringify(payload)}\n\`\`\`\n`;
}

const str = (v: unknown) => (typeof v === 'string' ? v : v === undefined || v === null ? '' : String(v));

/**
 * The block a fenced code block stands for, or null when it is ordinary code. A malformed
 * payload throws: a broken placeholder must not vanish from a contract silently.
 */
export function parseBlock(lang: string | undefined, text: string): DocumentBlock | null {
  if (!lang?.startsWith(BLOCK_PREFIX)) return null;
  const type = lang.slice(BLOCK_PREFIX.length);
  let data: Record<string, unknown>;
  try {
    data = JSON.parse(text.trim() || '{}');
  } catch {
    throw new Error(`The ${lang} block does not hold valid JSON.`);
  }
  if (typeof data !== 'object' || data === null) throw new Error(`The ${lang} block must hold a JSON object.`);
  switch (type) {
    case 'table': {
      const columns = Array.isArray(data.columns)
        ? data.columns.map((c: Record<string, unknown>) => ({ label: str(c?.label), align: c?.align === 'right' ? ('right' as const) : ('left' as const) }))
        : [];
      const rows = Array.isArray(data.rows) ? data.rows.map((r: unknown) => (Array.isArray(r) ? r.map(str) : [])) : [];
      const totals = Array.isArray(data.totals)
        ? data.totals.map((t: Record<string, unknown>) => ({ label: str(t?.label), amount: str(t?.amount), strong: t?.strong === true }))
        : [];
      return { type, columns, rows, totals };
    }
    case 'initials':
      return { type, key: str(data.key), label: str(data.label) || "Customer's initials" };
    case 'signature': {
      const parties = Array.isArray(data.parties)
        ? data.parties.map((p: Record<string, unknown>) => ({ role: str(p?.role), name: str(p?.name), onBehalfOf: str(p?.onBehalfOf) }))
        : [];
      return { type, parties };
    }
    default:
      throw new Error(`Unknown block ${lang}.`);
  }
}
