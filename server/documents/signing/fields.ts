/**
 * What a document asks its signer for, read from its Markdown: the initials boxes (by key, with
 * the clause heading each one sits beside) and the parties of its signature blocks. The signing
 * page asks for exactly these, and renderSignedPdf refuses a signature that leaves one empty.
 */
import { Lexer, type Token, type Tokens } from 'marked';
import { parseBlock } from '../blocks';

export interface InitialsField {
  key: string;
  label: string;
  /** The heading the box sits beside (a clause's "3. Weather and wind"), when it has one. */
  heading?: string;
}

export interface SigningFields {
  initials: InitialsField[];
  /** Roles of the signature blocks' parties, in order, e.g. ["Customer", "For the company"]. */
  signatureRoles: string[];
}

export function signingFields(markdown: string): SigningFields {
  const fields: SigningFields = { initials: [], signatureRoles: [] };
  const seen = new Set<string>();
  let lastHeading: string | undefined;
  const walk = (tokens: Token[]) => {
    for (const token of tokens) {
      if (token.type === 'heading') lastHeading = (token as Tokens.Heading).text.replace(/\\(.)/g, '$1');
      if (token.type === 'code') {
        const block = parseBlock((token as Tokens.Code).lang, (token as Tokens.Code).text);
        if (block?.type === 'initials' && !seen.has(block.key)) {
          seen.add(block.key);
          fields.initials.push({ key: block.key, label: block.label, heading: lastHeading });
        } else if (block?.type === 'signature') {
          const roles = block.parties.length ? block.parties.map((p) => p.role) : ['Customer'];
          fields.signatureRoles.push(...roles.filter((r) => !fields.signatureRoles.includes(r)));
        }
        continue;
      }
      const nested = token as Token & { tokens?: Token[]; items?: Tokens.ListItem[] };
      if (nested.items) nested.items.forEach((item) => walk(item.tokens));
      else if (nested.tokens && token.type !== 'heading' && token.type !== 'paragraph') walk(nested.tokens);
    }
  };
  walk(Lexer.lex(markdown, { gfm: true }));
  return fields;
}
