import type { SigningEventKind, SigningStatus } from '@shared/schemas/signing';
import type { BadgeTone } from '@/components/ui/badge';

export const SIGNING_STATUS_LABELS: Record<SigningStatus, string> = {
  pending: 'Waiting for signature',
  signed: 'Signed',
  void: 'Void',
  replaced: 'Replaced',
  expired: 'Expired',
  declined: 'Declined',
};

export const SIGNING_STATUS_TONES: Record<SigningStatus, BadgeTone> = {
  pending: 'caution',
  signed: 'positive',
  void: 'negative',
  replaced: 'neutral',
  expired: 'neutral',
  declined: 'negative',
};

export const SIGNING_EVENT_LABELS: Record<SigningEventKind, string> = {
  sent: 'Link e-mailed',
  opened: 'Opened the link',
  consented: 'Agreed to sign electronically',
  consent_withdrawn: 'Declined to sign electronically',
  initialed: 'Initialed',
  signed: 'Signed',
  voided: 'Link voided',
  replaced: 'Link replaced by a newer one',
  refused_stock: 'Signing refused: the items are no longer free',
};

/** The customer's initials from a name: "Dana M. Okafor-Reyes" -> "DMO". */
export function initialsOf(name: string): string {
  return name
    .split(/[\s-]+/)
    .map((word) => word.replace(/[^\p{L}]/gu, '').charAt(0))
    .filter(Boolean)
    .slice(0, 4)
    .join('')
    .toUpperCase();
}

const BROWSERS: Array<[RegExp, string]> = [
  [/Edg(?:e|A|iOS)?\/(\d+)/, 'Edge'],
  [/OPR\/(\d+)/, 'Opera'],
  [/SamsungBrowser\/(\d+)/, 'Samsung Internet'],
  [/Firefox\/(\d+)|FxiOS\/(\d+)/, 'Firefox'],
  [/Chrome\/(\d+)|CriOS\/(\d+)/, 'Chrome'],
  [/Version\/(\d+)[\d.]* (?:Mobile\/\S+ )?Safari/, 'Safari'],
];

const SYSTEMS: Array<[RegExp, string]> = [
  [/iPhone|iPad|iPod/, 'iOS'],
  [/Android/, 'Android'],
  [/Windows/, 'Windows'],
  [/Mac OS X|Macintosh/, 'macOS'],
  [/CrOS/, 'ChromeOS'],
  [/Linux/, 'Linux'],
];

/** "Chrome 126 on Android" from a user agent, enough to tell devices apart; the full string stays in a title. */
export function browserName(userAgent: string | null): string {
  if (!userAgent) return 'Unknown';
  let browser: string | null = null;
  for (const [pattern, name] of BROWSERS) {
    const m = pattern.exec(userAgent);
    if (m) {
      const version = m.slice(1).find(Boolean);
      browser = version ? `${name} ${version}` : name;
      break;
    }
  }
  const system = SYSTEMS.find(([pattern]) => pattern.test(userAgent))?.[1] ?? null;
  if (browser && system) return `${browser} on ${system}`;
  return browser ?? system ?? userAgent.slice(0, 60);
}
