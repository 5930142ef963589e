import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/field';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { paths } from '../../../app/paths';
import { useDocumentTitle } from '../../../hooks/use-document-title';
import { formatDateTime } from '../../../lib/labels';
import type { RevisionSummary } from '../../../shared/api/systems';
import { useProject } from '../../projects/api/get-project';
import { useSystem } from '../../systems/api/get-system';
import { revisionVerdict, VerdictMark } from '../../systems/components/verdict-mark';
import { plural } from '../lib/verdict';
import { SystemFieldChanges } from '../../field-changes/components/system-field-changes';
import { signed } from '../../../shared/format/quantity';
import { UNIT_LABELS } from '../../../engine/units';
import { walkPaths } from '../paths';

const STATUS_TONE = { draft: 'standpipe', issued: 'sound', superseded: 'neutral' } as const;

export function RevisionVerdictText({ revision, pressureUnit }: { revision: RevisionSummary; pressureUnit: string }) {
  const v = revision.verdict;
  if (!v.ok) return <VerdictMark verdict="unknown">Not computed: {v.errorMessage}</VerdictMark>;
  return (
    <span className="flex flex-wrap items-center gap-2">
      <VerdictMark verdict={revisionVerdict(v)} />
      {v.criticalMargin !== null ? (
        <span className="text-sm">
          critical margin {signed(v.criticalMargin, pressureUnit)} {pressureUnit}
        </span>
      ) : (
        <span className="text-sm text-ink-muted">no checked fixtures</span>
      )}
      {v.warningCount ? <span className="text-sm text-ink-muted">{plural(v.warningCount, 'warning')}</span> : null}
    </span>
  );
}

/** A system: its revisions (number, status, verdict, issued by and when), and a picker to compare two. */
export function SystemOverviewPage() {
  const { projectId = '', systemId = '' } = useParams();
  const project = useProject(projectId);
  const system = useSystem(projectId, systemId);
  const navigate = useNavigate();
  const [a, setA] = useState('');
  const [b, setB] = useState('');
  useDocumentTitle(system.data?.system.name ?? 'System');

  if (project.isError) return <ErrorView error={project.error} onRetry={() => void project.refetch()} what="this project" />;
  if (system.isError) return <ErrorView error={system.error} onRetry={() => void system.refetch()} what="this system" />;
  if (!project.data || !system.data) return <Loading label="Loading the system…" />;
  const { revisions } = system.data;
  const info = system.data.system;
  const current = revisions.find((r) => r.status === 'draft') ?? revisions[0];
  const options = [{ value: '', label: 'Choose a revision…' }, ...revisions.map((r) => ({ value: r.id, label: `Revision ${r.number} (${r.status})` }))];
  const pickA = a || revisions[1]?.id || '';
  const pickB = b || revisions[0]?.id || '';
  const issued = revisions.find((r) => r.status === 'issued') ?? null;

  return (
    <>
      <p className="text-sm">
        <Link to={paths.project.getHref(projectId)}>{project.data.project.name}</Link>
      </p>
      <PageHeader
        title={info.name}
        subtitle={`${info.service === 'hot' ? 'Hot water' : 'Cold water'} system · ${plural(revisions.length, 'revision')}`}
        actions={
          current ? (
            <Link
              className="rounded-md border-2 border-standpipe bg-standpipe px-4 py-2 text-sm font-semibold text-paper no-underline hover:text-paper"
              to={walkPaths.step.getHref(projectId, systemId, current.id, 'supply')}
            >
              {current.status === 'draft' ? `Walk the draft (revision ${current.number})` : `Open revision ${current.number}`}
            </Link>
          ) : null
        }
      />
      <div className="flex flex-col gap-6">
        <Section title="Revisions">
          <table className="w-full text-sm" data-testid="revisions-table">
            <caption className="sr-only">Revisions of {info.name}, newest first</caption>
            <thead>
              <tr className="border-b-2 border-rule text-left">
                <th scope="col" className="py-1 pr-3">
                  Revision
                </th>
                <th scope="col" className="py-1 pr-3">
                  Status
                </th>
                <th scope="col" className="py-1 pr-3">
                  Verdict
                </th>
                <th scope="col" className="py-1 pr-3">
                  Issued
                </th>
                <th scope="col" className="py-1">
                  Open
                </th>
              </tr>
            </thead>
            <tbody>
              {revisions.map((r) => (
                <tr key={r.id} className="border-b border-rule" data-testid={`revision-${r.number}`}>
                  <th scope="row" className="py-2 pr-3 text-left">
                    {r.number}
                  </th>
                  <td className="py-2 pr-3">
                    <Badge tone={STATUS_TONE[r.status]}>{r.status}</Badge>
                  </td>
                  <td className="py-2 pr-3">
                    <RevisionVerdictText revision={r} pressureUnit={UNIT_LABELS[project.data.project.unitSystem].pressure} />
                  </td>
                  <td className="py-2 pr-3">
                    {r.issuedAt ? `${formatDateTime(r.issuedAt)}${r.issuedBy ? ` by ${r.issuedBy}` : ''}` : `changed ${formatDateTime(r.updatedAt)}`}
                  </td>
                  <td className="py-2">
                    <span className="flex flex-wrap gap-3">
                      <Link to={walkPaths.step.getHref(projectId, systemId, r.id, 'result')} aria-label={`Result of revision ${r.number}`}>
                        Result
                      </Link>
                      <Link to={walkPaths.step.getHref(projectId, systemId, r.id, 'supply')} aria-label={`Walk revision ${r.number}`}>
                        Walk
                      </Link>
                      <Link to={walkPaths.table.getHref(projectId, systemId, r.id)} aria-label={`Segment table of revision ${r.number}`}>
                        Table
                      </Link>
                      <Link to={walkPaths.diagram.getHref(projectId, systemId, r.id)} aria-label={`Riser diagram of revision ${r.number}`}>
                        Diagram
                      </Link>
                    </span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </Section>
        <SystemFieldChanges projectId={projectId} systemId={systemId} myRole={project.data.project.myRole} issued={issued} />
        {revisions.length >= 2 ? (
          <Section title="Compare two revisions">
            <form
              className="flex flex-wrap items-end gap-3"
              aria-label="Compare two revisions"
              onSubmit={(ev) => {
                ev.preventDefault();
                if (pickA && pickB) navigate(walkPaths.compare.getHref(projectId, systemId, pickA, pickB));
              }}
            >
              <SelectField label="Revision A (before)" options={options} value={pickA} onChange={(ev) => setA(ev.target.value)} />
              <SelectField label="Revision B (after)" options={options} value={pickB} onChange={(ev) => setB(ev.target.value)} />
              <Button type="submit" disabled={!pickA || !pickB || pickA === pickB}>
                Compare
              </Button>
            </form>
            <p className="mt-2 text-sm text-ink-soft">A positive difference means revision B leaves the fixture more pressure than A.</p>
          </Section>
        ) : null}
      </div>
    </>
  );
}
