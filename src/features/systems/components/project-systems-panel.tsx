import { useState } from 'react';
import { Link } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { Loading } from '../../../components/ui/loading';
import { formatDate } from '../../../lib/labels';
import { UNIT_LABELS } from '../../../engine/units';
import { signed } from '../../../shared/format/quantity';
import type { SystemInfo } from '../../../shared/api/systems';
import type { ProjectRole } from '../../../shared/api/projects';
import { ReturnedSystemMark } from '../../reviews/components/returned-marker';
import { useProject } from '../../projects/api/get-project';
import { useSystems } from '../api/get-systems';
import { walkPaths } from '../../walk/paths';
import { ImportSystemForm } from './import-system-form';
import { NewSystemForm } from './new-system-form';
import { revisionVerdict, VERDICT_WORDS, VerdictMark } from './verdict-mark';

function SystemRow({
  projectId,
  system,
  myRole,
  pressureUnit,
}: {
  projectId: string;
  system: SystemInfo;
  myRole: ProjectRole | null;
  pressureUnit: string | null;
}) {
  const latest = system.latest;
  const v = latest?.verdict;
  return (
    <li
      className="flex flex-wrap items-center justify-between gap-3 rounded-md border-2 border-rule bg-surface px-4 py-3"
      data-testid={`system-${system.name}`}
    >
      <div>
        <Link to={walkPaths.system.getHref(projectId, system.id)} className="text-lg font-semibold">
          {system.name}
        </Link>
        <p className="text-sm text-ink-soft">
          {system.service === 'hot' ? 'Hot water' : 'Cold water'}
          {latest ? ` · revision ${latest.number}, changed ${formatDate(latest.updatedAt)}` : ''}
        </p>
        <ReturnedSystemMark marker={system.returned} myRole={myRole} />
      </div>
      <div className="flex flex-wrap items-center gap-2 text-sm">
        {latest ? <Badge tone={latest.status === 'issued' ? 'sound' : latest.status === 'draft' ? 'standpipe' : 'neutral'}>{latest.status}</Badge> : null}
        {v && v.ok ? (
          <VerdictMark verdict={revisionVerdict(v)}>
            {VERDICT_WORDS[revisionVerdict(v)]}
            {/* the margin waits for the project's unit system: a number is never shown in a unit it is not in */}
            {v.criticalMargin === null
              ? ', no checked fixtures'
              : pressureUnit
                ? `, critical margin ${signed(v.criticalMargin, pressureUnit)} ${pressureUnit}`
                : ''}
          </VerdictMark>
        ) : (
          <VerdictMark verdict="unknown">Not computed yet</VerdictMark>
        )}
      </div>
    </li>
  );
}

/** The project's systems with their latest verdict, and (for designers) a new system or an imported one. */
export function ProjectSystemsPanel({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const systems = useSystems(projectId);
  const project = useProject(projectId);
  const [adding, setAdding] = useState<'new' | 'import' | null>(null);
  return (
    <Section
      title="Systems"
      actions={
        canEdit ? (
          <>
            <Button
              variant={adding === 'new' ? 'primary' : 'secondary'}
              onClick={() => setAdding(adding === 'new' ? null : 'new')}
              aria-expanded={adding === 'new'}
            >
              New system
            </Button>
            <Button
              variant={adding === 'import' ? 'primary' : 'secondary'}
              onClick={() => setAdding(adding === 'import' ? null : 'import')}
              aria-expanded={adding === 'import'}
            >
              Import a system (JSON)
            </Button>
          </>
        ) : null
      }
    >
      {canEdit && adding === 'new' ? (
        <div className="mb-5 border-b-2 border-rule pb-5">
          <NewSystemForm projectId={projectId} unitSystem={project.data?.project.unitSystem ?? 'US'} />
        </div>
      ) : null}
      {canEdit && adding === 'import' ? (
        <div className="mb-5 border-b-2 border-rule pb-5">
          <ImportSystemForm projectId={projectId} />
        </div>
      ) : null}
      {systems.isPending ? <Loading label="Loading the systems…" /> : null}
      {systems.isError ? <ErrorView error={systems.error} onRetry={() => void systems.refetch()} what="the systems" /> : null}
      {systems.data ? (
        systems.data.length === 0 ? (
          <p className="text-ink-soft">No systems yet.{canEdit ? ' Create one, or import a system document.' : ' A designer adds them.'}</p>
        ) : (
          <ul className="flex flex-col gap-2" aria-label="Systems">
            {systems.data.map((s) => (
              <SystemRow
                key={s.id}
                projectId={projectId}
                system={s}
                myRole={project.data?.project.myRole ?? null}
                pressureUnit={project.data ? UNIT_LABELS[project.data.project.unitSystem].pressure : null}
              />
            ))}
          </ul>
        )
      ) : null}
    </Section>
  );
}
