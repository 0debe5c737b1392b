import { useUser } from '@/lib/auth';
import { PageHeader, Section } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { ForbiddenMessage, isSecondFactorRequired } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useUsers } from '@/features/users/api/get-users';
import { UsersList } from '@/features/users/components/users-list';
import { CreateUserForm } from '@/features/users/components/create-user-form';

function UsersPage({ currentUserId }: { currentUserId: number }) {
  const users = useUsers();
  return (
    <>
      <title>Users · Starledger</title>
      <PageHeader
        eyebrow="Site administration"
        title="Users"
        description="Every account on this Starledger. Project roles are given by each project’s lead astronomer."
      />
      {users.isPending ? <StatusLine>Loading accounts…</StatusLine> : null}
      {users.isError ? <QueryError what="The accounts" error={users.error} onRetry={() => void users.refetch()} /> : null}
      {users.data ? <UsersList users={users.data} currentUserId={currentUserId} /> : null}
      {/* Refused for want of a second factor, the page is only the way to turn it on. */}
      {isSecondFactorRequired(users.error) ? null : (
        <Section title="New account" className="mt-10">
          <CreateUserForm />
        </Section>
      )}
    </>
  );
}

export function AdminUsersRoute() {
  const user = useUser();
  // The server refuses too; this spares a non-administrator a page of errors.
  if (!user.isSiteAdmin) return <ForbiddenMessage detail="Only site administrators manage accounts." />;
  return <UsersPage currentUserId={user.id} />;
}
