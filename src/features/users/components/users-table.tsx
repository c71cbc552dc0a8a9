import type { UserRow as UserRowData } from '@shared/schemas/users';
import { Table, TBody, Th, THead, Tr } from '@/components/ui/table';
import { UserRow } from './user-row';

export function UsersTable({ users, currentUserId }: { users: readonly UserRowData[]; currentUserId?: string }) {
  return (
    <Table caption="Users of this company">
      <THead>
        <Tr>
          <Th>Name</Th>
          <Th>E-mail</Th>
          <Th>Role</Th>
          <Th>Status</Th>
          <Th>Last sign-in</Th>
          <Th>
            <span className="sr-only">Actions</span>
          </Th>
        </Tr>
      </THead>
      <TBody>
        {users.map((user) => (
          <UserRow key={user.id} user={user} isSelf={user.id === currentUserId} />
        ))}
      </TBody>
    </Table>
  );
}
