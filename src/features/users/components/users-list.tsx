import type { User } from '@shared/schemas/auth';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';

/** Every account on this Starledger instance. */
export function UsersList({ users, currentUserId }: { users: User[]; currentUserId: number }) {
  return (
    <LedgerTable aria-label="Accounts">
      <LedgerHead>
        <tr>
          <LedgerHeaderCell scope="col">Name</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">E-mail</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Site administrator</LedgerHeaderCell>
        </tr>
      </LedgerHead>
      <LedgerBody>
        {users.map((user) => (
          <LedgerRow key={user.id}>
            <LedgerCell className="font-semibold">
              {user.name}
              {user.id === currentUserId ? <span className="ml-1 text-xs font-normal text-ink-soft">(you)</span> : null}
            </LedgerCell>
            <LedgerCell>{user.email}</LedgerCell>
            <LedgerCell>{user.isSiteAdmin ? 'Yes' : 'No'}</LedgerCell>
          </LedgerRow>
        ))}
      </LedgerBody>
    </LedgerTable>
  );
}
