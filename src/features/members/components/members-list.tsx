import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { ROLE_LABELS } from '../../../lib/labels';
import type { Member, ProjectRole } from '../../../shared/api/projects';
import { useRemoveMember } from '../api/remove-member';
import { useUpdateMember } from '../api/update-member';
import type { MemberMutationConfig } from '../api/mutation-config';
import { ROLE_OPTIONS } from './role-options';

function MemberControls({ projectId, member, config }: { projectId: string; member: Member; config?: MemberMutationConfig }) {
  const update = useUpdateMember(projectId, config);
  const remove = useRemoveMember(projectId, config);
  const [role, setRole] = useState<ProjectRole>(member.role);
  const [confirmingRemove, setConfirmingRemove] = useState(false);
  const failure = update.error ?? remove.error;

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-2">
        <SelectField
          label={`Role of ${member.name}`}
          className="w-44"
          options={ROLE_OPTIONS}
          value={role}
          onChange={(event) => setRole(event.target.value as ProjectRole)}
        />
        <Button
          variant="secondary"
          disabled={role === member.role}
          pending={update.isPending}
          pendingLabel="Saving…"
          onClick={() => update.mutate({ userId: member.userId, body: { role } }, { onError: () => setRole(member.role) })}
        >
          Save role
        </Button>
        {confirmingRemove ? (
          <>
            <Button variant="danger" pending={remove.isPending} pendingLabel="Removing…" onClick={() => remove.mutate(member.userId)}>
              Yes, remove {member.name}
            </Button>
            <Button variant="secondary" onClick={() => setConfirmingRemove(false)}>
              Keep
            </Button>
          </>
        ) : (
          <Button variant="danger" onClick={() => setConfirmingRemove(true)}>
            Remove {member.name}…
          </Button>
        )}
      </div>
      <div aria-live="assertive">
        {failure ? (
          <Alert tone="fault" title="Membership not changed">
            {errorMessage(failure)}
          </Alert>
        ) : null}
      </div>
    </div>
  );
}

/** The project's members; designers of the project also get controls to change roles and remove people. */
export function MembersList({
  projectId,
  members,
  canManage,
  config,
}: {
  projectId: string;
  members: readonly Member[];
  canManage: boolean;
  config?: MemberMutationConfig;
}) {
  return (
    <table className="w-full border-collapse text-left">
      <caption className="sr-only">Project members and their roles</caption>
      <thead>
        <tr className="border-b-2 border-rule-strong text-sm">
          <th scope="col" className="py-2 pr-4">
            Name
          </th>
          <th scope="col" className="py-2 pr-4">
            E-mail address
          </th>
          <th scope="col" className="py-2 pr-4">
            Role
          </th>
          {canManage ? (
            <th scope="col" className="py-2">
              Change
            </th>
          ) : null}
        </tr>
      </thead>
      <tbody>
        {members.map((member) => (
          <tr key={member.userId} className="border-b border-rule align-top" data-testid={`member-${member.email}`}>
            <td className="py-3 pr-4 font-medium">{member.name}</td>
            <td className="py-3 pr-4 break-all">{member.email}</td>
            <td className="py-3 pr-4">
              <Badge tone="standpipe">{ROLE_LABELS[member.role]}</Badge>
            </td>
            {canManage ? (
              <td className="py-2">
                <MemberControls projectId={projectId} member={member} config={config} />
              </td>
            ) : null}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
