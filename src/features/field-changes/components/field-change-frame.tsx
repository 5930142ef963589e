import { useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { Alert } from '../../../components/ui/alert';
import { Loading } from '../../../components/ui/loading';
import { UNIT_LABELS } from '../../../engine';
import { useDocumentTitle } from '../../../hooks/use-document-title';
import { useWarnBeforeLeaving } from '../../../hooks/use-warn-before-leaving';
import { paths } from '../../../app/paths';
import type { User } from '../../../shared/api/auth';
import type { FieldChange } from '../../../shared/api/fieldChanges';
import type { Project } from '../../../shared/api/projects';
import type { Revision, SystemInfo } from '../../../shared/api/systems';
import { useCurrentUser } from '../../auth/api/use-current-user';
import { useProject } from '../../projects/api/get-project';
import type { Catalog } from '../../systems/api/get-catalog';
import { useCatalog } from '../../systems/api/get-catalog';
import { useRevision } from '../../systems/api/get-revision';
import { useSystem } from '../../systems/api/get-system';
import { analyseDraft } from '../../walk/draft/live-analysis';
import { parseStoredDocument, useDraft } from '../../walk/draft/use-draft';
import { WalkContext } from '../../walk/draft/walk-context';
import type { WalkContextValue, WalkLinks } from '../../walk/draft/walk-context';
import { StepFrameBody } from '../../walk/components/step-frame-body';
import { useSaveBeforeLeaving } from '../../walk/draft/use-save-before-leaving';
import { SaveBar } from '../../walk/components/save-bar';
import { StepNav } from '../../walk/components/step-nav';
import { walkPaths } from '../../walk/paths';
import { useFieldChange } from '../api/get-field-change';
import type { FieldChangeIds } from '../api/urls';
import { fieldChangePaths } from '../paths';
import { FIELD_CHANGE_STEPS } from '../steps';
import type { FieldChangeStepId } from '../steps';
import { FieldChangeContext } from './field-change-context';
import type { FieldChangeContextValue } from './field-change-context';
import { useFieldChangeStore } from './field-change-store';
import { FieldChangeStatusBadge } from './status-badge';

export function fieldChangeReadOnlyReason(fieldChange: Pick<FieldChange, 'status' | 'number' | 'createdBy'>, user: Pick<User, 'id'>): string | null {
  if (fieldChange.status !== 'draft') return `Field change ${fieldChange.number} is ${fieldChange.status}: it no longer changes.`;
  if (fieldChange.createdBy.id !== user.id) return `This field change is ${fieldChange.createdBy.name}’s draft: only they change it until they propose it.`;
  return null;
}

export function fieldChangeLinks({ projectId, systemId, fieldChangeId }: FieldChangeIds): WalkLinks {
  return {
    step: (step) => fieldChangePaths.step.getHref(projectId, systemId, fieldChangeId, step as FieldChangeStepId),
    // the table edits the tree (rise, ends); a field change edits pipe on its own step
    table: null,
    // a field change substitutes pipe and fittings; it never regenerates the building
    building: null,
    diagram: fieldChangePaths.diagram.getHref(projectId, systemId, fieldChangeId),
    up: { href: walkPaths.system.getHref(projectId, systemId), label: 'System overview and revisions' },
  };
}

function Frame({
  ids,
  project,
  system,
  fieldChange,
  base,
  catalog,
  user,
}: {
  ids: FieldChangeIds;
  project: Project;
  system: SystemInfo;
  fieldChange: FieldChange;
  base: Revision;
  catalog: Catalog;
  user: User;
}) {
  const readOnlyReason = fieldChangeReadOnlyReason(fieldChange, user);
  const store = useFieldChangeStore(ids);
  const draft = useDraft(store, fieldChange, readOnlyReason === null);
  const { step } = useParams();
  const live = useMemo(() => (draft.document ? analyseDraft(draft.document) : null), [draft.document]);
  const baseDocument = useMemo(() => parseStoredDocument(base), [base]);
  const issuedLive = useMemo(() => (baseDocument ? analyseDraft(baseDocument) : null), [baseDocument]);
  const links = useMemo(() => fieldChangeLinks(ids), [ids]);
  useDocumentTitle(`Field change ${fieldChange.number} · ${system.name}`);

  useWarnBeforeLeaving(draft.state !== 'saved');
  const frameBase = fieldChangePaths.view.getHref(ids.projectId, ids.systemId, ids.fieldChangeId);
  useSaveBeforeLeaving(draft, readOnlyReason === null, (pathname) => pathname === frameBase || pathname.startsWith(`${frameBase}/`));

  if (!draft.document || !live || !baseDocument || !issuedLive) {
    return (
      <Alert tone="fault" title="This field change cannot be read">
        Its document or the issued revision’s does not match the system format. Ask the designer to check the issued revision.
      </Alert>
    );
  }
  const walk: WalkContextValue = {
    ids: { projectId: ids.projectId, systemId: ids.systemId, revisionId: base.id },
    project,
    system,
    revision: base,
    readOnlyReason,
    scope: 'field-change',
    links,
    draft,
    document: draft.document,
    live,
    catalog,
    units: UNIT_LABELS[draft.document.unitSystem],
  };
  const frame: FieldChangeContextValue = {
    ids,
    fieldChange,
    base,
    baseDocument,
    issuedLive,
    readOnlyReason,
    isAuthor: fieldChange.createdBy.id === user.id,
    isDesigner: project.myRole === 'designer',
  };

  return (
    <FieldChangeContext.Provider value={frame}>
      <WalkContext.Provider value={walk}>
        <div className="mb-4 border-b-2 border-rule pb-4 print:border-0">
          <p className="text-sm print:hidden">
            <Link to={paths.project.getHref(project.id)}>{project.name}</Link>
            <span aria-hidden="true"> › </span>
            <Link to={walkPaths.system.getHref(ids.projectId, ids.systemId)}>{system.name}</Link>
            <span aria-hidden="true"> › </span>
            <Link to={walkPaths.step.getHref(ids.projectId, ids.systemId, base.id, 'result')}>Revision {base.number}</Link>
          </p>
          <div className="mt-1 flex flex-wrap items-center gap-3">
            <h1 className="text-3xl">
              Field change {fieldChange.number}: {fieldChange.title}
            </h1>
            <FieldChangeStatusBadge status={fieldChange.status} />
          </div>
          <p className="mt-1 text-sm text-ink-soft">
            On issued revision {base.number} of {system.name} · by {fieldChange.createdBy.name} · units {draft.document.unitSystem}
          </p>
        </div>
        <div className="mb-4 flex flex-col gap-4">
          <StepNav links={links} steps={FIELD_CHANGE_STEPS} label="Steps of the field change" />
          {readOnlyReason ? (
            <p className="rounded-md border-2 border-rule bg-paper-deep p-3 print:hidden" data-testid="read-only-note">
              {readOnlyReason}
            </p>
          ) : (
            <SaveBar draft={draft} editable />
          )}
        </div>
        <StepFrameBody generation={draft.generation} live={live} withLedger={Boolean(step) && step !== 'diagram'} />
      </WalkContext.Provider>
    </FieldChangeContext.Provider>
  );
}

/** The frame of one field change: loads it with the issued revision, keeps its draft, shows its steps. */
export function FieldChangeFrame() {
  const { projectId = '', systemId = '', fieldChangeId = '' } = useParams();
  const ids = useMemo(() => ({ projectId, systemId, fieldChangeId }), [projectId, systemId, fieldChangeId]);
  const user = useCurrentUser();
  const project = useProject(projectId);
  const system = useSystem(projectId, systemId);
  const fieldChange = useFieldChange(ids);
  const base = useRevision(projectId, systemId, fieldChange.data?.baseRevision.id ?? '');
  const catalog = useCatalog();

  for (const query of [project, system, fieldChange, base, catalog]) {
    if (query.isError) return <ErrorView error={query.error} onRetry={() => void query.refetch()} what="this field change" />;
  }
  if (!project.data || !system.data || !fieldChange.data || !base.data || !catalog.data) return <Loading label="Opening the field change…" />;
  return (
    <Frame
      key={fieldChangeId}
      ids={ids}
      project={project.data.project}
      system={system.data.system}
      fieldChange={fieldChange.data}
      base={base.data}
      catalog={catalog.data}
      user={user}
    />
  );
}
