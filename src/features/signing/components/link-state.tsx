import type { SigningPage } from '@shared/schemas/signing';
import { isApiError } from '@/lib/api';
import { CompanyContact, SigningLayout } from './signing-layout';
import { StepCard } from './step-heading';

type Company = SigningPage['company'];

const TITLES: Record<string, string> = {
  link_unknown: 'We can’t find this signing link',
  link_expired: 'This signing link has expired',
  link_void: 'This signing link was cancelled',
  link_replaced: 'A newer signing link was sent',
  link_used: 'This agreement is already signed',
  link_declined: 'You chose not to sign electronically',
};

const ADVICE: Record<string, string> = {
  link_unknown: 'Check that the whole address from the e-mail is in your browser. If it is, ask the company for a new link.',
  link_expired: 'Signing links work for a limited time. Ask the company to send you a new one.',
  link_void: 'The company cancelled this link, perhaps because the agreement changed. Ask them for a new one if you still need to sign.',
  link_replaced: 'Use the link in the most recent e-mail from the company. If you can’t find it, ask them to send it again.',
  link_used: 'Nothing more is needed here. Your signed copy was e-mailed to you; ask the company if you need another.',
  link_declined: 'Contact the company to sign the agreement on paper, or to ask for a new link if you change your mind.',
};

/** The company from a 404/410 body, when the server knows which company the link was for. */
function companyOf(error: unknown): Company | null {
  if (!isApiError(error)) return null;
  // The server puts it beside `error` in the body; inside `error` is read too.
  const body = error.body as { company?: Partial<Company> | null; error?: { company?: Partial<Company> | null } } | null;
  const c = body?.company ?? body?.error?.company;
  return c && c.name ? { name: c.name, phone: c.phone ?? '', email: c.email ?? '' } : null;
}

/**
 * A calm page for a link that cannot be used: what is wrong, what to do, and whom to ask.
 * `code` is the server's (link_expired ...); the server's message comes first when it sent one.
 */
export function LinkStateView({ code, message, company }: { code: string; message?: string | null; company: Company | null }) {
  const title = TITLES[code] ?? 'This signing link can’t be used';
  return (
    <SigningLayout companyName={company?.name ?? null} title={title}>
      <StepCard>
        <div className="space-y-2 text-canvas-800">
          {/* The server's message says how to get a new link; ours is for when it sent none. */}
          <p>{message || (ADVICE[code] ?? 'Ask the company for a new link.')}</p>
        </div>
        {company ? (
          <>
            <p className="mt-4 text-sm font-semibold text-canvas-800">Contact</p>
            <CompanyContact company={company} />
          </>
        ) : (
          <p className="mt-4 text-sm text-canvas-700">The company’s phone number and e-mail address are on the e-mail that brought you here.</p>
        )}
      </StepCard>
    </SigningLayout>
  );
}

/** The link state from a failed call: 404 is an unknown link, 410 says which kind of ended link. */
export function linkStateFromError(error: unknown): { code: string; message: string; company: Company | null } | null {
  if (!isApiError(error)) return null;
  if (error.status === 404) return { code: 'link_unknown', message: error.message, company: companyOf(error) };
  if (error.status === 410) return { code: error.code, message: error.message, company: companyOf(error) };
  return null;
}

/** A page that loads but whose request has ended (the server may answer 200 with the status). */
export const STATUS_CODES: Partial<Record<SigningPage['status'], string>> = {
  void: 'link_void',
  replaced: 'link_replaced',
  expired: 'link_expired',
};
