/**
 * Templates are Handlebars over Markdown. Values are Markdown-escaped before they reach the
 * template (a customer named "*Star* Events" stays literal text), the helpers place the blocks
 * from blocks.ts, and a private Handlebars instance in strict mode throws on a variable the
 * values do not hold. validateTemplate finds the same mistakes before anything is saved, with
 * their line numbers, by walking the parsed template.
 */
import Handlebars from 'handlebars';
import { blockMarkdown, type TableBlock } from './blocks';
import type { Clause } from './clauses';
import type { DocumentValues } from './values';

export type TemplateContext = 'document' | 'clause' | 'email';

export interface TemplateProblem {
  line: number;
  column?: number;
  message: string;
  variable?: string;
}

export type TemplateValidation = { ok: true } | { ok: false; errors: TemplateProblem[] };

/** A template that cannot be rendered; the first problem says where. */
export class TemplateError extends Error {
  constructor(readonly errors: TemplateProblem[]) {
    super(errors.map((e) => `line ${e.line}: ${e.message}`).join('; '));
    this.name = 'TemplateError';
  }
}

const hb = Handlebars.create();

/** Helpers that place blocks; e-mails are plain text and take none of them. */
const BLOCK_HELPERS = ['lineItems', 'clauses', 'initials', 'signatureBlock'] as const;
/** Helpers with arguments, and how many. */
const HELPER_ARITY: Record<string, number> = { initials: 1, upper: 1, lower: 1 };
const FORMAT_HELPERS = ['upper', 'lower'];

interface RenderData {
  raw: DocumentValues;
  clauses: Clause[];
  inClause: boolean;
}

const rawOf = (options: Handlebars.HelperOptions): RenderData => {
  const data = options.data as { renderData?: RenderData } | undefined;
  if (!data?.renderData) throw new Error('Document helpers need values: render with renderDocumentMarkdown.');
  return data.renderData;
};

/**
 * Backslash-escapes what Markdown would read as formatting. CommonMark lets any ASCII
 * punctuation be escaped; only the characters that start emphasis, links, code, HTML or tables
 * anywhere, and those that start a heading, list or quote at the start of a line, need it.
 *
 * A value is never a link either: GFM's extended autolinks (GitHub Flavored Markdown spec
 * 0.29-gfm, §6.9 "Autolinks (extension)", from memory) make one of "https://...", "www...." and
 * "name@host" in plain text. An escape inside each trigger ("https\://", "www\.", "name\@host")
 * stops that and prints the same characters. Links stay what the company writes in its own
 * template text.
 */
export function escapeMarkdown(text: string): string {
  return text
    .replace(/[\\`*_[\]<>|~&]/g, (c) => `\\${c}`)
    .replace(/:(?=\/\/)/g, '\\:')
    .replace(/(www)\./gi, '$1\\.')
    .replace(/@/g, '\\@')
    .replace(/^(\s*)([#>+=-])/gm, '$1\\$2')
    .replace(/^(\s*\d+)([.)])/gm, '$1\\$2');
}

function escapeValues<T>(value: T): T {
  if (typeof value === 'string') return escapeMarkdown(value) as T;
  if (Array.isArray(value)) return value.map(escapeValues) as T;
  if (value && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, escapeValues(v)])) as T;
  }
  return value;
}

hb.registerHelper('lineItems', function (options: Handlebars.HelperOptions) {
  const { raw } = rawOf(options);
  const withExtraDays = raw.lines.some((l) => l.extraDays !== '');
  // An invoice record's own lines are amounts only (a share of the booking, a damage charge): no quantity or unit price.
  const withQuantities = raw.lines.some((l) => l.quantity !== '' || l.unitPrice !== '');
  const table: TableBlock = {
    type: 'table',
    columns: [
      { label: 'Description', align: 'left' },
      ...(withQuantities ? [{ label: 'Qty', align: 'right' as const }, { label: 'Unit price', align: 'right' as const }] : []),
      ...(withExtraDays ? [{ label: 'Extra days', align: 'right' as const }] : []),
      { label: 'Amount', align: 'right' },
    ],
    rows: raw.lines.map((l) => [l.description, ...(withQuantities ? [l.quantity, l.unitPrice] : []), ...(withExtraDays ? [l.extraDays] : []), l.total]),
    totals: raw.summary.map((s) => ({ label: s.label, amount: s.amount, strong: s.strong })),
  };
  return blockMarkdown(table);
});

hb.registerHelper('initials', function (key: unknown, options: Handlebars.HelperOptions) {
  rawOf(options);
  if (typeof key !== 'string' || !key) throw new Error('{{initials}} takes a key in quotes, e.g. {{initials "weather"}}.');
  return blockMarkdown({ type: 'initials', key, label: "Customer's initials" });
});

hb.registerHelper('signatureBlock', function (options: Handlebars.HelperOptions) {
  const { raw } = rawOf(options);
  return blockMarkdown({
    type: 'signature',
    parties: [
      { role: 'Customer', name: raw.customer.name, onBehalfOf: '' },
      { role: 'For the company', name: '', onBehalfOf: raw.company.name },
    ],
  });
});

hb.registerHelper('clauses', function (this: unknown, options: Handlebars.HelperOptions) {
  const data = rawOf(options);
  if (data.inClause) throw new Error('A clause cannot place {{clauses}}.');
  const root = (options.data as { root: unknown }).root;
  const ordered = [...data.clauses].sort((a, b) => a.position - b.position);
  return ordered
    .map((clause, i) => {
      const body = compile(clause.body)(root, { data: { renderData: { ...data, inClause: true } } });
      const initials = clause.requiresInitials ? blockMarkdown({ type: 'initials', key: clause.key, label: "Customer's initials" }) : '';
      // The initials block follows the heading straight away, so the box sits beside the
      // clause's title (and moves with it to a new page), not somewhere after its last line.
      return `\n### ${i + 1}. ${escapeMarkdown(clause.title)}\n${initials}\n${body.trim()}\n`;
    })
    .join('\n');
});

hb.registerHelper('upper', (s: unknown) => String(s ?? '').toUpperCase());
hb.registerHelper('lower', (s: unknown) => String(s ?? '').toLowerCase());

const cache = new Map<string, Handlebars.TemplateDelegate>();
function compile(source: string): Handlebars.TemplateDelegate {
  let template = cache.get(source);
  if (!template) {
    template = hb.compile(source, { strict: true, noEscape: true });
    if (cache.size > 500) cache.clear();
    cache.set(source, template);
  }
  return template;
}

/** "\"nmae\" not defined in [object Object] - 12:3" -> line 12. */
function problemFromRuntime(error: unknown, where: string): TemplateProblem {
  const e = error as { message?: string; lineNumber?: number; column?: number };
  const message = String(e.message ?? error);
  const at = / - (\d+):(\d+)$/.exec(message);
  const missing = /^"([^"]+)" not defined/.exec(message);
  return {
    line: e.lineNumber ?? (at ? Number(at[1]) : 1),
    column: e.column !== undefined ? e.column + 1 : at ? Number(at[2]) + 1 : undefined,
    message: `${where}${missing ? `unknown variable ${missing[1]}` : message.replace(/ - \d+:\d+$/, '')}`,
    ...(missing ? { variable: missing[1] } : {}),
  };
}

/** The template filled in: Markdown with the placeholders of blocks.ts. Throws TemplateError. */
export function renderDocumentMarkdown(source: string, values: DocumentValues, clauses: Clause[]): string {
  const renderData: RenderData = { raw: values, clauses, inClause: false };
  try {
    return compile(source)(escapeValues(values), { data: { renderData } });
  } catch (error) {
    if (error instanceof TemplateError) throw error;
    throw new TemplateError([problemFromRuntime(error, '')]);
  }
}

/** Plain-text rendering (e-mails): no Markdown escaping, no block helpers. */
export function renderPlainText(source: string, values: Record<string, unknown>): string {
  try {
    return compile(source)(values);
  } catch (error) {
    throw new TemplateError([problemFromRuntime(error, '')]);
  }
}

// ---- validation --------------------------------------------------------------------------

type Node = hbs.AST.Node;
type Expr = hbs.AST.Expression;

class VariableIndex {
  private readonly values = new Set<string>();
  private readonly groups = new Set<string>();
  private readonly lists = new Set<string>();
  constructor(variables: string[]) {
    for (const v of variables) this.values.add(v);
    for (const v of variables) {
      const parts = v.split('.');
      for (let i = 1; i < parts.length; i++) {
        const prefix = parts.slice(0, i).join('.');
        if (this.values.has(prefix)) this.lists.add(prefix);
        else this.groups.add(prefix);
      }
    }
  }
  kind(path: string): 'value' | 'list' | 'group' | 'unknown' {
    if (path === '') return 'group';
    if (this.lists.has(path)) return 'list';
    if (this.values.has(path)) return 'value';
    if (this.groups.has(path)) return 'group';
    return 'unknown';
  }
}

const DATA_VARIABLES = new Set(['index', 'first', 'last', 'key']);

/**
 * Checks a template without values: Handlebars syntax, then every variable against `variables`
 * (inside {{#each list}} against the list items' fields), helpers and their arguments.
 */
export function validateTemplate(source: string, opts: { variables: string[]; context?: TemplateContext }): TemplateValidation {
  let ast: hbs.AST.Program;
  try {
    ast = hb.parse(source);
  } catch (error) {
    return { ok: false, errors: [syntaxProblem(error)] };
  }
  const context = opts.context ?? 'document';
  const helpers = new Set<string>([...FORMAT_HELPERS, 'lookup']);
  if (context !== 'email') BLOCK_HELPERS.forEach((h) => helpers.add(h));
  if (context === 'clause') helpers.delete('clauses');

  const index = new VariableIndex(opts.variables);
  const errors: TemplateProblem[] = [];
  const report = (node: Node, message: string, variable?: string) =>
    errors.push({ line: node.loc?.start.line ?? 1, column: node.loc ? node.loc.start.column + 1 : undefined, message, ...(variable ? { variable } : {}) });

  /** The scope stack holds variable-path prefixes: '' is the document, 'lines' an item of lines. */
  const resolve = (path: hbs.AST.PathExpression, scopes: string[]): { full: string; kind: ReturnType<VariableIndex['kind']> } | null => {
    if (path.data) {
      if (path.parts[0] === 'root') {
        const full = path.parts.slice(1).join('.');
        return { full, kind: index.kind(full) };
      }
      if (path.parts.length === 1 && DATA_VARIABLES.has(path.parts[0]) && scopes.length > 1) return { full: `@${path.parts[0]}`, kind: 'value' };
      report(path, `unknown variable @${path.parts.join('.')}`, `@${path.parts.join('.')}`);
      return null;
    }
    if (path.depth >= scopes.length) {
      report(path, `${path.original} goes above the document`, path.original);
      return null;
    }
    const prefix = scopes[scopes.length - 1 - path.depth];
    const full = [prefix, ...path.parts].filter(Boolean).join('.');
    return { full, kind: index.kind(full) };
  };

  const checkValue = (expr: Expr, scopes: string[], asArgument: boolean) => {
    if (expr.type === 'SubExpression') return visitCall(expr as hbs.AST.SubExpression, scopes);
    if (expr.type !== 'PathExpression') return; // a literal
    const path = expr as hbs.AST.PathExpression;
    const r = resolve(path, scopes);
    if (!r) return;
    const shown = path.original;
    if (r.kind === 'unknown') {
      // Inside {{#each lines}} a person writes {{prise}}, so the message names what they wrote.
      const scope = path.data || path.depth > 0 ? '' : scopes[scopes.length - 1];
      if (scope) report(path, `unknown variable ${shown} in the items of ${scope}`, shown);
      else report(path, `unknown variable ${r.full || shown}`, r.full || shown);
    }
    else if (!asArgument && r.kind === 'group') report(path, `${shown} is a group of values, not one value: name a field such as ${shown}.name`, shown);
    else if (!asArgument && r.kind === 'list') report(path, `${shown} is a list: show it with {{#each ${shown}}}...{{/each}}`, shown);
  };

  const isHelperCall = (path: Expr) =>
    path.type === 'PathExpression' &&
    !(path as hbs.AST.PathExpression).data &&
    (path as hbs.AST.PathExpression).depth === 0 &&
    (path as hbs.AST.PathExpression).parts.length === 1 &&
    helpers.has((path as hbs.AST.PathExpression).parts[0]);

  const checkArguments = (node: hbs.AST.MustacheStatement | hbs.AST.SubExpression | hbs.AST.BlockStatement, scopes: string[]) => {
    for (const p of node.params) checkValue(p, scopes, true);
    for (const pair of node.hash?.pairs ?? []) checkValue(pair.value, scopes, true);
  };

  const visitCall = (node: hbs.AST.MustacheStatement | hbs.AST.SubExpression, scopes: string[]) => {
    const path = node.path as Expr;
    const name = path.type === 'PathExpression' ? (path as hbs.AST.PathExpression).original : '';
    const hasArgs = node.params.length > 0 || (node.hash?.pairs.length ?? 0) > 0;
    if (isHelperCall(path)) {
      const arity = HELPER_ARITY[name];
      if (arity !== undefined && node.params.length !== arity) report(node, `{{${name}}} takes ${arity} argument${arity === 1 ? '' : 's'}`);
      if (arity === undefined && name !== 'lookup' && node.params.length > 0) report(node, `{{${name}}} takes no arguments`);
      if (name === 'initials' && node.params[0] && node.params[0].type !== 'StringLiteral') report(node, '{{initials}} takes a key in quotes, e.g. {{initials "weather"}}');
      checkArguments(node, scopes);
      return;
    }
    if (path.type === 'PathExpression' && (BLOCK_HELPERS as readonly string[]).includes(name)) {
      report(node, `{{${name}}} is not available in ${context === 'email' ? 'an e-mail' : 'a clause'}`, name);
      return;
    }
    if (hasArgs || node.type === 'SubExpression') {
      report(node, `unknown helper ${name}`, name);
      return;
    }
    checkValue(path, scopes, false);
  };

  const visit = (node: Node, scopes: string[]): void => {
    switch (node.type) {
      case 'Program':
        for (const s of (node as hbs.AST.Program).body) visit(s, scopes);
        return;
      case 'MustacheStatement':
        visitCall(node as hbs.AST.MustacheStatement, scopes);
        return;
      case 'BlockStatement': {
        const block = node as hbs.AST.BlockStatement;
        const name = (block.path as hbs.AST.PathExpression).original;
        if (!['if', 'unless', 'each', 'with'].includes(name)) {
          report(block, `unknown block helper #${name}: use #if, #unless, #each or #with`, name);
          return;
        }
        if (block.params.length !== 1) {
          report(block, `{{#${name}}} takes exactly one argument`);
          return;
        }
        checkArguments(block, scopes);
        let inner = scopes;
        const param = block.params[0];
        if ((name === 'each' || name === 'with') && param.type === 'PathExpression') {
          const r = resolve(param as hbs.AST.PathExpression, scopes);
          const shown = (param as hbs.AST.PathExpression).original;
          if (r && name === 'each' && r.kind !== 'list' && r.kind !== 'unknown') report(param, `${shown} is not a list: #each needs one`, shown);
          if (r && name === 'with' && r.kind !== 'group' && r.kind !== 'unknown') report(param, `${shown} is not a group of values: #with needs one`, shown);
          if (r && (r.kind === 'list' || r.kind === 'group')) inner = [...scopes, r.full];
          else return; // already reported; the body cannot be checked against an unknown scope
        } else if (name === 'each' || name === 'with') {
          report(block, `{{#${name}}} needs a variable`);
          return;
        }
        if (block.program) visit(block.program, inner);
        if (block.inverse) visit(block.inverse, scopes);
        return;
      }
      case 'PartialStatement':
      case 'PartialBlockStatement':
        report(node, 'partials ({{> name}}) are not available in documents');
        return;
      case 'DecoratorBlock':
      case 'Decorator':
        report(node, 'decorators are not available in documents');
        return;
      default:
        return; // content, comments
    }
  };
  visit(ast, ['']);

  if (errors.length === 0) {
    try {
      hb.precompile(source, { strict: true, noEscape: true });
    } catch (error) {
      errors.push(problemFromRuntime(error, ''));
    }
  }
  errors.sort((a, b) => a.line - b.line || (a.column ?? 0) - (b.column ?? 0));
  return errors.length ? { ok: false, errors } : { ok: true };
}

/** Handlebars' parser says "Parse error on line 3:\n<context>\n----^\nExpecting ..., got 'X'". */
function syntaxProblem(error: unknown): TemplateProblem {
  const e = error as { message?: string; lineNumber?: number; column?: number };
  const message = String(e.message ?? error);
  if (e.lineNumber !== undefined) {
    const mismatch = /^(\S+) doesn't match (\S+)/.exec(message);
    return {
      line: e.lineNumber,
      column: e.column !== undefined ? e.column + 1 : undefined,
      message: mismatch
        ? `syntax error: {{#${mismatch[1]}}} opened on this line is closed with {{/${mismatch[2]}}}`
        : `syntax error: ${message.replace(/ - \d+:\d+$/, '')}`,
    };
  }
  const lines = message.split('\n');
  const at = /(?:Parse|Lexical) error on line (\d+)/.exec(lines[0]);
  const near = lines[1]?.trim().replace(/^\.\.\./, '') ?? '';
  const got = /got '([^']+)'/.exec(message)?.[1];
  const detail =
    got === 'EOF'
      ? 'the template ends inside an open block: a closing {{/if}}, {{/each}}, {{/unless}} or {{/with}} is missing'
      : got === 'INVALID'
        ? `unexpected characters near "${near}"; a variable is written {{name}}`
        : got
          ? `unexpected ${got.toLowerCase().replace(/_/g, ' ')} near "${near}"`
          : message.split('\n').slice(1).join(' ') || message;
  return { line: at ? Number(at[1]) : 1, message: `syntax error: ${detail}` };
}
