import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { errorMessage, isApiError } from '@/lib/api';
import { CAUGHT_MAIL_REFRESH_MS, useCaughtMail } from '@/features/dev-mail/api/get-caught-mail';
import { MailList } from '@/features/dev-mail/components/mail-list';
import { MailMessage } from '@/features/dev-mail/components/mail-message';
import { requireArea } from '../../guards';

export const clientLoader = (queryClient: QueryClient) => ({ request }: LoaderFunctionArgs) => requireArea(queryClient, request, 'devInbox').then(() => null);

export default function DevMailRoute() {
  const [autoRefresh, setAutoRefresh] = useState(true);
  const mail = useCaughtMail({ autoRefresh });
  const [selectedId, setSelectedId] = useState<string | null>(null);

  const mails = mail.data ?? [];
  const selected = mails.find((m) => m.id === selectedId) ?? mails[0] ?? null;
  const sinkOff = isApiError(mail.error) && mail.error.status === 404;

  return (
    <>
      <PageHeader
        title="Mail inbox"
        description={
          <>
            The demo's caught mail. While Guyline runs as a demo, the mail it sends for your company (to your customers and your own
            staff) is caught by a local mail sink instead of reaching anyone, and shows up here for the owner. It holds live sign-in,
            reset, signing and pay links: treat it like the real mailboxes. This inbox only exists while the local mail sink runs.
          </>
        }
        actions={
          <>
            <Button variant="secondary" onClick={() => void mail.refetch()} isLoading={mail.isFetching}>
              Refresh
            </Button>
            <label className="inline-flex items-center gap-2 text-sm text-canvas-800">
              <input type="checkbox" className="size-4 accent-pine-700" checked={autoRefresh} onChange={(e) => setAutoRefresh(e.target.checked)} />
              Refresh every {CAUGHT_MAIL_REFRESH_MS / 1000} seconds
            </label>
          </>
        }
      />
      {mail.isPending ? (
        <PageSpinner label="Loading caught mail…" />
      ) : mail.isError && !mail.data ? (
        sinkOff ? (
          <Alert tone="warning" title="The local mail sink is not running.">
            Start Guyline with its local fakes to catch mail here.
          </Alert>
        ) : (
          <Alert tone="danger" title="The caught mail could not be loaded.">
            {errorMessage(mail.error)}
          </Alert>
        )
      ) : mails.length === 0 ? (
        <EmptyState title="No mail caught yet.">Invite a user or ask for a password reset, and the mail appears here.</EmptyState>
      ) : (
        <div className="grid gap-4 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
          <MailList mails={mails} selectedId={selected?.id ?? null} onSelect={setSelectedId} />
          {selected ? <MailMessage key={selected.id} mail={selected} /> : null}
        </div>
      )}
    </>
  );
}
