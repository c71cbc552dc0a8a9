import type { QueryClient } from '@tanstack/react-query';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { SectionCard } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { errorMessage } from '@/lib/api';
import { useMe } from '@/features/auth/api/get-me';
import { usersQueryOptions, USERS_PAGE_SIZE, useUsers } from '@/features/users/api/get-users';
import { InviteUserForm } from '@/features/users/components/invite-user-form';
import { UsersTable } from '@/features/users/components/users-table';
import { requireArea } from '../../guards';

function pageFrom(params: URLSearchParams): number {
  const page = Number(params.get('page') ?? '1');
  return Number.isInteger(page) && page > 0 ? page : 1;
}

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requireArea(queryClient, request, 'users');
  void queryClient.prefetchQuery(usersQueryOptions(pageFrom(new URL(request.url).searchParams)));
  return null;
};

export default function UsersRoute() {
  const [params, setParams] = useSearchParams();
  const page = pageFrom(params);
  const users = useUsers(page);
  const { data: me } = useMe();

  return (
    <>
      <PageHeader title="Users" description="Everyone who works in your company’s Guyline, and what each may do." />
      <div className="space-y-6">
        <SectionCard title="Invite a user" description="They get an e-mail with a link to choose a password.">
          <InviteUserForm />
        </SectionCard>

        <section aria-labelledby="team-heading">
          <div className="mb-3 flex items-center gap-3">
            <h2 id="team-heading" className="text-lg font-semibold text-canvas-900">
              Your team
            </h2>
            {users.isFetching && !users.isPending ? <Spinner className="text-canvas-600" label="Updating…" /> : null}
          </div>
          {users.isPending ? (
            <PageSpinner label="Loading users…" />
          ) : users.isError ? (
            <Alert tone="danger" title="The users could not be loaded.">
              {errorMessage(users.error)}
            </Alert>
          ) : users.data.data.length === 0 ? (
            <EmptyState title="No users on this page." />
          ) : (
            <>
              <UsersTable users={users.data.data} currentUserId={me?.user.id} />
              <Pagination
                label="Users pages"
                page={page}
                pageSize={USERS_PAGE_SIZE}
                total={users.data.total}
                onPageChange={(next) => setParams(next > 1 ? { page: String(next) } : {})}
              />
            </>
          )}
        </section>
      </div>
    </>
  );
}
