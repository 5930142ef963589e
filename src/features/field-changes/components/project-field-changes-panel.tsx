import { Section } from '../../../components/ui/card';
import { useProjectFieldChanges } from '../api/get-field-changes';
import { FieldChangesQueryView } from './field-changes-list';

/** The project's field changes, newest first (a designer sees the proposed ones waiting for them here). */
export function ProjectFieldChangesPanel({ projectId }: { projectId: string }) {
  const query = useProjectFieldChanges(projectId);
  const waiting = query.data?.filter((fc) => fc.status === 'proposed').length ?? 0;
  return (
    <Section title={waiting ? `Field changes (${waiting} waiting for a decision)` : 'Field changes'}>
      <FieldChangesQueryView query={query} showSystem />
    </Section>
  );
}
