import { Section } from '../../../components/ui/card';
import { useSystemFieldChanges } from '../api/get-field-changes';
import { FieldChangesQueryView } from './field-changes-list';
import { StartFieldChange } from './start-field-change';

/** A system's field changes, and for a contractor the way to start one on the current issued revision. */
export function SystemFieldChanges({
  projectId,
  systemId,
  myRole,
  issued,
}: {
  projectId: string;
  systemId: string;
  myRole: string | null;
  /** the system's current issued revision, if any */
  issued: { id: string; number: number } | null;
}) {
  const query = useSystemFieldChanges(projectId, systemId);
  return (
    <Section title="Field changes">
      <div className="flex flex-col gap-4">
        {myRole === 'contractor' && issued ? (
          <StartFieldChange projectId={projectId} systemId={systemId} revisionId={issued.id} revisionNumber={issued.number} />
        ) : null}
        {myRole === 'contractor' && !issued ? <p className="text-sm">A field change starts from an issued revision; this system has none yet.</p> : null}
        <FieldChangesQueryView query={query} showSystem={false} />
      </div>
    </Section>
  );
}
