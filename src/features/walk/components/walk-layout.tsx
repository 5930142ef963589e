import { useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Loading } from '../../../components/ui/loading';
import { UNIT_LABELS } from '../../../engine';
import { useDocumentTitle } from '../../../hooks/use-document-title';
import { useWarnBeforeLeaving } from '../../../hooks/use-warn-before-leaving';
import { paths } from '../../../app/paths';
import type { Project } from '../../../shared/api/projects';
import type { Revision, SystemInfo } from '../../../shared/api/systems';
import { useProject } from '../../projects/api/get-project';
import type { Catalog } from '../../systems/api/get-catalog';
import { useCatalog } from '../../systems/api/get-catalog';
import { useRevision } from '../../systems/api/get-revision';
import { useSystem } from '../../systems/api/get-system';
import { analyseDraft } from '../draft/live-analysis';
import { useDraft } from '../draft/use-draft';
import { useFedFromSync } from '../draft/use-fed-from';
import { useRevisionStore } from '../draft/revision-store';
import { useSaveBeforeLeaving } from '../draft/use-save-before-leaving';
import type { Leaving } from '../draft/use-save-before-leaving';
import { Button } from '../../../components/ui/button';
import { WalkContext } from '../draft/walk-context';
import type { WalkContextValue, WalkIds, WalkLinks } from '../draft/walk-context';
import { walkPaths } from '../paths';
import type { WalkStepId } from '../steps';
import { ExportButton } from './export-button';
import { StepFrameBody } from './step-frame-body';
import { NewDraftButton } from './new-draft-button';
import { SaveBar } from './save-bar';
import { StepNav } from './step-nav';
import { RevisionOriginNote } from './revision-origin-note';
import { StartFieldChange } from '../../field-changes/components/start-field-change';
import { ReturnedSystemMark } from '../../reviews/components/returned-marker';
import { ReviewCommentsPanel } from './review-comments-panel';
import { buildingPaths } from '../../building/paths';

/** While leaving the walk: the last change being saved, or the question when a value cannot be saved. */
function LeavingNote({ leaving, held }: { leaving: Leaving; held: number }) {
  if (leaving.state === 'saving')
    return (
      <p role="status" className="mb-2 text-sm font-semibold" data-testid="saving-before-leaving">
        Saving your last change before leaving…
      </p>
    );
  if (leaving.state !== 'held') return null;
  return (
    <div className="mb-3" data-testid="leave-with-held">
      <Alert
        tone="caution"
        title={`${held === 1 ? '1 value is' : `${held} values are`} not saved`}
        actions={
          <>
            <Button onClick={leaving.stay}>Stay and correct it</Button>
            <Button variant="secondary" onClick={leaving.leave}>
              Leave without it
            </Button>
          </>
        }
      >
        A field holds a value that cannot be saved (see the save state above). Everything else is saved when you leave.
      </Alert>
    </div>
  );
}

const STATUS_TONE = { draft: 'standpipe', issued: 'sound', superseded: 'neutral' } as const;

export function readOnlyReasonFor(project: Pick<Project, 'myRole'>, revision: Pick<Revision, 'status' | 'number'>): string | null {
  if (revision.status !== 'draft') return `Revision ${revision.number} is ${revision.status}: it never changes. Start a new draft from it to make changes.`;
  if (project.myRole !== 'designer') return 'You can read this draft. The project’s designers change it.';
  return null;
}

export function revisionLinks({ projectId, systemId, revisionId }: WalkIds): WalkLinks {
  return {
    step: (step) => walkPaths.step.getHref(projectId, systemId, revisionId, step as WalkStepId),
    table: walkPaths.table.getHref(projectId, systemId, revisionId),
    building: buildingPaths.building.getHref(projectId, systemId, revisionId),
    diagram: walkPaths.diagram.getHref(projectId, systemId, revisionId),
    up: { href: walkPaths.system.getHref(projectId, systemId), label: 'System overview and revisions' },
  };
}

function WalkFrame({ ids, project, system, revision, catalog }: { ids: WalkIds; project: Project; system: SystemInfo; revision: Revision; catalog: Catalog }) {
  const readOnlyReason = readOnlyReasonFor(project, revision);
  const store = useRevisionStore(ids);
  const draft = useDraft(store, revision, readOnlyReason === null);
  useFedFromSync(ids.projectId, draft, readOnlyReason === null);
  const links = useMemo((): WalkLinks => revisionLinks(ids), [ids]);
  const { step } = useParams();
  // The engine's share of an edit is 1–2 ms on a 500-segment system (npm run bench), so the
  // analysis runs in the same render as the edit: no second, deferred render of every consumer.
  const live = useMemo(() => (draft.document ? analyseDraft(draft.document) : null), [draft.document]);
  useDocumentTitle(`${system.name} · revision ${revision.number}`);

  useWarnBeforeLeaving(draft.state !== 'saved');
  const frameBase = walkPaths.revision.getHref(ids.projectId, ids.systemId, ids.revisionId);
  const leaving = useSaveBeforeLeaving(draft, readOnlyReason === null, (pathname) => pathname === frameBase || pathname.startsWith(`${frameBase}/`));

  if (!draft.document || !live) {
    return (
      <Alert tone="fault" title="This revision’s document cannot be read">
        The stored document does not match the system format. Start a new draft or import a corrected file.
      </Alert>
    );
  }
  const value: WalkContextValue = {
    ids,
    project,
    system,
    revision,
    readOnlyReason,
    scope: 'design',
    links,
    draft,
    document: draft.document,
    live,
    catalog,
    units: UNIT_LABELS[draft.document.unitSystem],
  };

  return (
    <WalkContext.Provider value={value}>
      <div className="mb-4 border-b-2 border-rule pb-4 print:border-0">
        <p className="text-sm print:hidden">
          <Link to={paths.project.getHref(project.id)}>{project.name}</Link>
          <span aria-hidden="true"> › </span>
          <Link to={walkPaths.system.getHref(ids.projectId, ids.systemId)}>{system.name}</Link>
        </p>
        <div className="mt-1 flex flex-wrap items-center gap-3">
          <h1 className="text-3xl">{system.name}</h1>
          <Badge tone={STATUS_TONE[revision.status]}>
            Revision {revision.number} · {revision.status}
          </Badge>
          <span className="text-sm text-ink-soft">
            {system.service === 'hot' ? 'Hot water' : 'Cold water'} · units {draft.document.unitSystem}
          </span>
          <ExportButton document={draft.document} fileName={`${system.name} revision ${revision.number}`} />
          <ReturnedSystemMark marker={system.returned} myRole={project.myRole} />
        </div>
      </div>
      <LeavingNote leaving={leaving} held={draft.held.length} />
      {revision.origin ? <RevisionOriginNote origin={revision.origin} ids={ids} /> : null}
      <div className="mb-4 flex flex-col gap-4">
        <StepNav links={links} />
        <ReviewCommentsPanel />
        {readOnlyReason ? (
          <div className="flex flex-col gap-3 rounded-md border-2 border-rule bg-paper-deep p-3 print:hidden" data-testid="read-only-note">
            <p>{readOnlyReason}</p>
            {revision.status !== 'draft' && project.myRole === 'designer' ? <NewDraftButton ids={ids} /> : null}
            {revision.status === 'issued' && project.myRole === 'contractor' ? (
              <StartFieldChange projectId={ids.projectId} systemId={ids.systemId} revisionId={revision.id} revisionNumber={revision.number} />
            ) : null}
          </div>
        ) : (
          <SaveBar draft={draft} editable />
        )}
      </div>
      <StepFrameBody generation={draft.generation} live={live} withLedger={Boolean(step)} withBar />
    </WalkContext.Provider>
  );
}

/** The frame of one revision: loads it, keeps the draft, and shows the steps beside the live ledger. */
export function WalkLayout() {
  const { projectId = '', systemId = '', revisionId = '' } = useParams();
  const ids = useMemo(() => ({ projectId, systemId, revisionId }), [projectId, systemId, revisionId]);
  const project = useProject(projectId);
  const system = useSystem(projectId, systemId);
  const revision = useRevision(projectId, systemId, revisionId);
  const catalog = useCatalog();

  for (const query of [project, system, revision, catalog]) {
    if (query.isError) return <ErrorView error={query.error} onRetry={() => void query.refetch()} what="this system" />;
  }
  if (!project.data || !system.data || !revision.data || !catalog.data) return <Loading label="Opening the system…" />;
  return <WalkFrame key={revisionId} ids={ids} project={project.data.project} system={system.data.system} revision={revision.data} catalog={catalog.data} />;
}
