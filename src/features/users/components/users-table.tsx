import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/error-messages';
import { ROLE_LABELS, USER_STATUS_LABELS } from '../../../lib/labels';
import type { User } from '../../../shared/api/auth';
import type { Invitation } from '../../../shared/api/users';
import { useReissueInvitation } from '../api/reissue-invitation';
import { useUpdateUser } from '../api/update-user';

const STATUS_TONE = { invited: 'caution', active: 'sound', disabled: 'fault' } as const;

function UserActions({ user, isSelf, onInvitation }: { user: User; isSelf: boolean; onInvitation: (user: User, invitation: Invitation) => void }) {
  const update = useUpdateUser();
  const reissue = useReissueInvitation();
  const failure = update.error ?? reissue.error;
  const disabled = user.status === 'disabled';

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap gap-2">
        {!disabled ? (
          <Button
            variant="secondary"
            pending={reissue.isPending}
            pendingLabel="Making link…"
            onClick={() => reissue.mutate(user.id, { onSuccess: (invitation) => onInvitation(user, invitation) })}
          >
            {user.status === 'invited' ? 'New invitation link' : 'Password reset link'}
            <span className="sr-only"> for {user.name}</span>
          </Button>
        ) : null}
        {!isSelf ? (
          <>
            <Button
              variant="secondary"
              pending={update.isPending && update.variables?.body.isAdmin !== undefined}
              onClick={() => update.mutate({ userId: user.id, body: { isAdmin: !user.isAdmin, version: user.version } })}
            >
              {user.isAdmin ? 'Remove administrator' : 'Make administrator'}
              <span className="sr-only"> ({user.name})</span>
            </Button>
            <Button
              variant={disabled ? 'secondary' : 'danger'}
              pending={update.isPending && update.variables?.body.disabled !== undefined}
              onClick={() => update.mutate({ userId: user.id, body: { disabled: !disabled, version: user.version } })}
            >
              {disabled ? 'Enable' : 'Disable'}
              <span className="sr-only"> {user.name}</span>
            </Button>
          </>
        ) : (
          <span className="text-sm text-ink-muted">This is you</span>
        )}
      </div>
      <div aria-live="assertive">
        {failure ? (
          <Alert tone="fault" title={`${user.name}: not changed`}>
            {errorMessage(failure)}
          </Alert>
        ) : null}
      </div>
    </div>
  );
}

export function UsersTable({
  users,
  currentUserId,
  onInvitation,
}: {
  users: readonly User[];
  currentUserId: string;
  onInvitation: (user: User, invitation: Invitation) => void;
}) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Accounts</caption>
        <thead>
          <tr className="border-b-2 border-rule-strong text-sm">
            <th scope="col" className="py-2 pr-4">
              Name
            </th>
            <th scope="col" className="py-2 pr-4">
              E-mail address
            </th>
            <th scope="col" className="py-2 pr-4">
              Kind of account
            </th>
            <th scope="col" className="py-2 pr-4">
              Status
            </th>
            <th scope="col" className="py-2">
              Actions
            </th>
          </tr>
        </thead>
        <tbody>
          {users.map((user) => (
            <tr key={user.id} className="border-b border-rule align-top" data-testid={`user-${user.email}`}>
              <td className="py-3 pr-4 font-medium">{user.name}</td>
              <td className="py-3 pr-4 break-all">{user.email}</td>
              <td className="py-3 pr-4">
                <div className="flex flex-wrap gap-1">
                  <Badge>{ROLE_LABELS[user.accountRole]}</Badge>
                  {user.isAdmin ? <Badge tone="copper">Administrator</Badge> : null}
                </div>
              </td>
              <td className="py-3 pr-4">
                <Badge tone={STATUS_TONE[user.status]}>{USER_STATUS_LABELS[user.status]}</Badge>
              </td>
              <td className="py-2">
                <UserActions user={user} isSelf={user.id === currentUserId} onInvitation={onInvitation} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
