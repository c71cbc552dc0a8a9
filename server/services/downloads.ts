import { encodeExtended } from 'content-disposition';

/**
 * The Content-Disposition of every download (certificates, photos, PDFs, exports, ZIPs, calendar
 * feeds, day sheets), built one way so a file name can never write its own headers.
 *
 * `filename=` is plain printable ASCII: accents are dropped, anything else becomes "_". The real
 * name, when it is not plain ASCII, goes in `filename*=UTF-8''...` (RFC 6266 §4.3, percent-encoded
 * as RFC 8187 §3.2, which replaced RFC 5987), which browsers prefer. The header itself is therefore
 * always ASCII: Node writes header strings as Latin-1, so a character such as U+010D, put there
 * raw, would go out as its low byte (a CR).
 */
export function contentDisposition(filename: string, type: 'inline' | 'attachment' = 'attachment'): string {
  const name = cleanName(filename) || 'download';
  const fallback = asciiFallback(name);
  // Always quoted (the fallback holds no quote or backslash), so `filename="..."` reads the same
  // for every download; the package's encoder writes the UTF-8 form.
  const header = `${type}; filename="${fallback}"`;
  return fallback === name ? header : `${header}; filename*=${encodeExtended(name)}`;
}

// Control characters (C0, DEL, C1), the Unicode line and paragraph separators, and the
// direction marks that can make "invoice<U+202E>fdp.exe" read as "invoiceexe.pdf".
const UNSAFE_IN_NAMES = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;

// Half of a surrogate pair has no UTF-8 form (encodeURIComponent throws on it).
const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;

/** The name as a person should see it: no control or direction characters, at most 200 characters. */
function cleanName(filename: string): string {
  const name = filename.replace(LONE_SURROGATE, '\ufffd').normalize('NFC').replace(UNSAFE_IN_NAMES, '_').trim();
  return Array.from(name).slice(0, 200).join('');
}

/**
 * The ASCII stand-in: "Čelo ľudí.pdf" -> "Celo ludi.pdf". Quotes, backslashes and "%" go too:
 * some clients read "%XX" in `filename=` as an escape (the content-disposition package's own rule).
 */
function asciiFallback(name: string): string {
  return name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^\x20-\x7e]|["\\%]/gu, '_');
}
