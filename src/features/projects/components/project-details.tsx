import { ADOPTED_CODE_LABELS, type Project } from '../../../shared/api/projects';
import { formatDateTime, UNIT_SYSTEM_LABELS } from '../../../lib/labels';

function Value({ text }: { text: string }) {
  return text.trim() === '' ? <span className="text-ink-muted italic">Not given</span> : <span className="whitespace-pre-wrap">{text}</span>;
}

export function ProjectDetails({ project }: { project: Project }) {
  return (
    <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-[12rem_1fr]">
      <dt className="font-semibold">Building address</dt>
      <dd>
        <Value text={project.address} />
      </dd>
      <dt className="font-semibold">Code basis</dt>
      <dd>
        <Value text={project.codeBasis} />
      </dd>
      <dt className="font-semibold">Permit or plan check</dt>
      <dd>
        <Value text={project.permit.permitNumber} />
      </dd>
      <dt className="font-semibold">Code adopted</dt>
      <dd>
        <Value text={project.permit.adoptedCode ? ADOPTED_CODE_LABELS[project.permit.adoptedCode] : ''} />
        {project.permit.localAmendments ? <span className="block whitespace-pre-wrap">Local amendments: {project.permit.localAmendments}</span> : null}
      </dd>
      <dt className="font-semibold">Preparer&rsquo;s licence</dt>
      <dd>
        <Value text={[project.permit.preparerLicence, project.permit.licenceJurisdiction].filter(Boolean).join(', ')} />
      </dd>
      <dt className="font-semibold">Units</dt>
      <dd>{UNIT_SYSTEM_LABELS[project.unitSystem]}</dd>
      <dt className="font-semibold">Notes</dt>
      <dd>
        <Value text={project.notes} />
      </dd>
      <dt className="font-semibold">Last changed</dt>
      <dd>{formatDateTime(project.updatedAt)}</dd>
    </dl>
  );
}
