import type { QueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import type { ClauseInput, ClauseRow } from '@shared/schemas/documents';
import { Alert, LiveRegion } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SectionCard } from '@/components/ui/card';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { PageSpinner } from '@/components/ui/spinner';
import { TextLink } from '@/components/ui/text-link';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api';
import { clausesQueryOptions, useClauses } from '@/features/templates/api/get-clauses';
import { useDeleteClause } from '@/features/templates/api/delete-clause';
import { useTemplates } from '@/features/templates/api/get-templates';
import { useUpdateClause } from '@/features/templates/api/update-clause';
import { ClauseForm } from '@/features/templates/components/clause-form';
import { ClausesList } from '@/features/templates/components/clauses-list';
import { requireMe } from '../../../guards';

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireMe(queryClient, request);
  void queryClient.prefetchQuery(clausesQueryOptions());
  return null;
};

const inputOf = (c: ClauseRow, position = c.position): ClauseInput => ({
  key: c.key,
  title: c.title,
  body: c.body,
  requiresInitials: c.requiresInitials,
  active: c.active,
  position,
});

export default function ClausesRoute() {
  const clauses = useClauses();
  const templates = useTemplates();
  const canEdit = clauses.data?.can.update ?? false;
  const [editing, setEditing] = useState<ClauseRow | 'new' | null>(null);
  const [deleting, setDeleting] = useState<ClauseRow | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [moveError, setMoveError] = useState<string | null>(null);
  const [moving, setMoving] = useState(false);
  const formHeading = useRef<HTMLDivElement>(null);
  const update = useUpdateClause();
  const remove = useDeleteClause();

  const list = clauses.data?.data ?? [];
  const nextPosition = list.reduce((max, c) => Math.max(max, c.position), 0) + 10;
  const variables = templates.data?.data.find((t) => t.name === 'rental-agreement')?.variables ?? [];

  const open = (target: ClauseRow | 'new') => {
    setMessage(null);
    setEditing(target);
    requestAnimationFrame(() => {
      formHeading.current?.scrollIntoView({ block: 'start' });
      formHeading.current?.querySelector<HTMLInputElement>('input')?.focus();
    });
  };

  /** Swap with the neighbour; when both share a position, number the whole list in tens first. */
  const move = async (index: number, by: -1 | 1) => {
    const a = list[index];
    const b = list[index + by];
    if (!a || !b) return;
    setMoving(true);
    setMessage(null);
    setMoveError(null);
    try {
      if (a.position !== b.position) {
        await update.mutateAsync({ id: a.id, body: inputOf(a, b.position) });
        await update.mutateAsync({ id: b.id, body: inputOf(b, a.position) });
      } else {
        const order = [...list];
        [order[index], order[index + by]] = [order[index + by], order[index]];
        for (const [i, c] of order.entries()) if (c.position !== (i + 1) * 10) await update.mutateAsync({ id: c.id, body: inputOf(c, (i + 1) * 10) });
      }
      setMessage(`Moved “${a.title}” ${by < 0 ? 'up' : 'down'}.`);
    } catch (error) {
      setMoveError(errorMessage(error));
    } finally {
      setMoving(false);
    }
  };

  return (
    <>
      <p className="mb-2 text-sm">
        <TextLink to={paths.app.settings.getHref()}>Back to company settings</TextLink>
      </p>
      <PageHeader
        title="Clause library"
        description={
          <>
            The terms your rental agreements print, in this order. Only active clauses go into new agreements; ones that ask for initials get a box
            for the customer’s initials. The rest of the agreement is its{' '}
            <TextLink to={paths.app.settingsTemplate.getHref('rental-agreement')}>template</TextLink>.
          </>
        }
        actions={
          canEdit && editing === null ? (
            <Button onClick={() => open('new')} disabled={moving}>
              New clause
            </Button>
          ) : null
        }
      />
      <LiveRegion>{message ? <Alert tone="success" className="mb-4">{message}</Alert> : null}</LiveRegion>
      {moveError ? (
        <Alert tone="danger" className="mb-4" title="The order was not saved.">
          {moveError}
        </Alert>
      ) : null}
      {clauses.data && !canEdit ? <p className="mb-4 text-sm text-canvas-700">You can read the clauses; changing them is the owner’s.</p> : null}

      {editing !== null ? (
        <div ref={formHeading} className="mb-6 scroll-mt-4">
          <SectionCard title={editing === 'new' ? 'New clause' : `Edit clause: ${editing.title}`}>
            <ClauseForm
              key={editing === 'new' ? 'new' : editing.id}
              clause={editing === 'new' ? null : editing}
              nextPosition={nextPosition}
              variables={variables}
              onCancel={() => setEditing(null)}
              onSaved={(c) => {
                setEditing(null);
                setMessage(`Clause “${c.title}” saved.`);
              }}
            />
          </SectionCard>
        </div>
      ) : null}

      {clauses.isPending ? (
        <PageSpinner label="Loading the clauses…" />
      ) : clauses.isError ? (
        <Alert tone="danger" title="The clauses could not be loaded.">
          {errorMessage(clauses.error)}
        </Alert>
      ) : list.length === 0 ? (
        <EmptyState title="No clauses yet">A rental agreement without clauses prints the event, the items and the signatures only.</EmptyState>
      ) : (
        <ClausesList clauses={list} canEdit={canEdit} busy={moving || editing !== null} onEdit={open} onMove={(i, by) => void move(i, by)} onDelete={setDeleting} />
      )}

      <ConfirmDialog
        open={deleting !== null}
        title={deleting ? `Delete the clause “${deleting.title}”?` : ''}
        confirmLabel="Delete clause"
        confirmVariant="danger"
        isLoading={remove.isPending}
        error={remove.isError ? errorMessage(remove.error) : null}
        onCancel={() => {
          remove.reset();
          setDeleting(null);
        }}
        onConfirm={() =>
          deleting &&
          remove.mutate(deleting.id, {
            onSuccess: () => {
              setMessage(`Clause “${deleting.title}” deleted.`);
              setDeleting(null);
            },
          })
        }
      >
        <p>New rental agreements leave it out. Agreements already issued keep it. To leave it out for now and keep its text, make it inactive instead.</p>
      </ConfirmDialog>
    </>
  );
}
