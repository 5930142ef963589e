import { useState } from 'react';
import { ErrorView } from '../../components/errors/error-view';
import { Alert } from '../../components/ui/alert';
import { Section } from '../../components/ui/card';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { useCurrentUser } from '../../features/auth/api/use-current-user';
import { useUsers } from '../../features/users/api/get-users';
import { CreateUserForm } from '../../features/users/components/create-user-form';
import { InvitationLink } from '../../features/users/components/invitation-link';
import { UsersTable } from '../../features/users/components/users-table';
import { useDocumentTitle } from '../../hooks/use-document-title';
import type { Invitation } from '../../shared/api/users';

function UsersPage({ currentUserId }: { currentUserId: string }) {
  const users = useUsers();
  const [shown, setShown] = useState<{ person: string; invitation: Invitation } | null>(null);
  const show = (user: { name: string; email: string }, invitation: Invitation) => setShown({ person: `${user.name} (${user.email})`, invitation });

  return (
    <div className="flex flex-col gap-6">
      {shown ? <InvitationLink person={shown.person} invitation={shown.invitation} onDismiss={() => setShown(null)} /> : null}
      <Section title="Create an account">
        <CreateUserForm onCreated={({ user, invitation }) => show(user, invitation)} />
      </Section>
      <Section title="Accounts">
        {users.isPending ? <Loading label="Loading accounts…" /> : null}
        {users.isError ? <ErrorView error={users.error} onRetry={() => void users.refetch()} what="the accounts" /> : null}
        {users.data ? <UsersTable users={users.data} currentUserId={currentUserId} onInvitation={show} /> : null}
      </Section>
    </div>
  );
}

export function UsersRoute() {
  useDocumentTitle('Users');
  const user = useCurrentUser();
  return (
    <>
      <PageHeader title="Users" subtitle="Accounts, invitations and administrators." />
      {user.isAdmin ? (
        <UsersPage currentUserId={user.id} />
      ) : (
        <Alert tone="caution" title="For administrators">
          Only administrators manage accounts.
        </Alert>
      )}
    </>
  );
}
