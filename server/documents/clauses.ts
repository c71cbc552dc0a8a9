/**
 * The clause library: the terms a rental agreement draws on, in order. The defaults ship in
 * templates/clauses/<position>-<key>.md with a small front matter; each company edits its own
 * copies, which are stored rows of the same shape.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export interface Clause {
  key: string;
  title: string;
  /** Markdown + Handlebars, over the same variables as the document templates. */
  body: string;
  requiresInitials: boolean;
  position: number;
}

export const clausesDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'templates', 'clauses');

const FILE_NAME = /^(\d+)-([a-z0-9]+(?:-[a-z0-9]+)*)\.md$/;

/**
 * One clause file: `---`, `title: ...`, `initials: true|false`, `---`, then the body. The file
 * name gives the position and the key.
 */
export function parseClauseFile(fileName: string, source: string): Clause {
  const name = FILE_NAME.exec(fileName);
  if (!name) throw new Error(`Clause file ${fileName} must be named <position>-<key>.md`);
  const front = /^---\r?\n([\s\S]*?)\r?\n---\r?\n?/.exec(source);
  if (!front) throw new Error(`Clause file ${fileName} must start with front matter between --- lines.`);
  const fields = new Map<string, string>();
  for (const line of front[1].split(/\r?\n/)) {
    const m = /^([A-Za-z]+):\s*(.*)$/.exec(line.trim());
    if (m) fields.set(m[1], m[2].trim().replace(/^"(.*)"$/, '$1'));
  }
  const title = fields.get('title');
  if (!title) throw new Error(`Clause file ${fileName} needs a title.`);
  const initials = fields.get('initials') ?? 'false';
  if (initials !== 'true' && initials !== 'false') throw new Error(`Clause file ${fileName}: initials is true or false.`);
  return {
    key: name[2],
    title,
    body: source.slice(front[0].length).trim(),
    requiresInitials: initials === 'true',
    position: Number(name[1]),
  };
}

/** The shipped clauses, in position order. */
export function loadDefaultClauses(): Clause[] {
  return fs
    .readdirSync(clausesDir)
    .filter((f) => f.endsWith('.md'))
    .map((f) => parseClauseFile(f, fs.readFileSync(path.join(clausesDir, f), 'utf8')))
    .sort((a, b) => a.position - b.position);
}
