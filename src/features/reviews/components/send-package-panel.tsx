import { useState } from 'react';
import { Alert, LiveMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { TextAreaField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { useMembers } from '../../members/api/get-members';
import { useSystems } from '../../systems/api/get-systems';
import { useSendPackage } from '../api/send-package';

/**
 * One submission for a building (designers): tick the systems (cold, hot, each zone) and the
 * inspectors; each inspector gets one e-mail with one PDF per system, and reviews each system on
 * its own, so the comments stay with their system.
 */
export function SendPackagePanel({ projectId }: { projectId: string }) {
  const systems = useSystems(projectId);
  const members = useMembers(projectId);
  const send = useSendPackage();
  const [systemIds, setSystemIds] = useState<string[]>([]);
  const [inspectorIds, setInspectorIds] = useState<string[]>([]);
  const [message, setMessage] = useState('');
  const [done, setDone] = useState<string | null>(null);
  const inspectors = (members.data ?? []).filter((m) => m.role === 'inspector');
  const list = systems.data ?? [];
  if (list.length < 2 || inspectors.length === 0) return null;
  const toggle = (ids: string[], id: string) => (ids.includes(id) ? ids.filter((x) => x !== id) : [...ids, id]);
  const fields = (send.error as { fields?: Record<string, string> } | null)?.fields ?? {};
  const submit = () => {
    setDone(null);
    send.mutate(
      { projectId, body: { systemIds, inspectorIds, ...(message.trim() ? { message: message.trim() } : {}) } },
      {
        onSuccess: (r) =>
          setDone(
            `Sent as one submission: ${r.reviews.length / Math.max(1, inspectorIds.length)} system(s) to ${r.messages.map((m) => m.toAddress).join(', ')}.`,
          ),
      },
    );
  };
  return (
    <Section title="Send the building as one submission">
      <p className="mb-3 max-w-prose text-sm text-ink-soft">
        Each chosen system’s issued revision goes in one e-mail per inspector, with one PDF per system attached. The inspector accepts or returns each system on
        its own.
      </p>
      <div className="grid gap-4 sm:grid-cols-2">
        <fieldset>
          <legend className="text-sm font-semibold">Systems</legend>
          {list.map((s) => (
            <label key={s.id} className="mt-1 flex items-center gap-2">
              <input type="checkbox" className="size-4" checked={systemIds.includes(s.id)} onChange={() => setSystemIds(toggle(systemIds, s.id))} />
              {s.name}
              {fields[`systemIds.${systemIds.indexOf(s.id)}`] && systemIds.includes(s.id) ? (
                <span className="text-sm text-fault">⚠ {fields[`systemIds.${systemIds.indexOf(s.id)}`]}</span>
              ) : null}
            </label>
          ))}
        </fieldset>
        <fieldset>
          <legend className="text-sm font-semibold">Inspectors</legend>
          {inspectors.map((m) => (
            <label key={m.userId} className="mt-1 flex items-center gap-2">
              <input
                type="checkbox"
                className="size-4"
                checked={inspectorIds.includes(m.userId)}
                onChange={() => setInspectorIds(toggle(inspectorIds, m.userId))}
              />
              {m.name} ({m.email})
            </label>
          ))}
        </fieldset>
      </div>
      <TextAreaField className="mt-3" label="Note to the inspectors (optional)" value={message} onChange={(ev) => setMessage(ev.target.value)} />
      <div className="mt-3">
        <Button onClick={submit} pending={send.isPending} pendingLabel="Sending…" disabled={systemIds.length === 0 || inspectorIds.length === 0}>
          Send {systemIds.length} system(s) as one submission
        </Button>
      </div>
      <LiveMessage tone="sound" message={done} />
      {send.isError ? (
        <Alert tone="fault" title="Not sent">
          {errorMessage(send.error)}
        </Alert>
      ) : null}
    </Section>
  );
}
