import { Link } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { Section } from '../../../components/ui/card';
import { Loading } from '../../../components/ui/loading';
import { useWalk } from '../../walk/draft/walk-context';
import { CAUTIONS } from '../../walk/cautions';
import { useComparison } from '../api/get-comparison';
import { AttachmentsPanel } from '../components/attachments-panel';
import { ComparisonSections } from '../components/comparison-view';
import { DecisionPanel } from '../components/decision-panel';
import { DetailsForm } from '../components/details-form';
import { useFieldChangeFrame } from '../components/field-change-context';

/**
 * The side by side of a field change — issued against proposed at every checked fixture, each
 * changed segment and device, new warnings — with its files and its decision. The figures are the
 * server's two independent engine runs of the saved documents.
 */
export function FieldChangePage() {
  const { ids, fieldChange, readOnlyReason, isAuthor, isDesigner } = useFieldChangeFrame();
  const { draft, links } = useWalk();
  const comparison = useComparison(ids);
  const editable = readOnlyReason === null;
  return (
    <div className="flex flex-col gap-6" data-testid="field-change-page">
      <div className="grid gap-6 lg:grid-cols-2">
        <Section title="The substitution" headingLevel={3}>
          {editable ? (
            <DetailsForm ids={ids} fieldChange={fieldChange} draft={draft} />
          ) : (
            <div>
              <p className="whitespace-pre-line">{fieldChange.description || 'No description given.'}</p>
            </div>
          )}
          {editable ? (
            <p className="mt-4 text-sm">
              Change the <Link to={links.step('pipe')}>pipe and sizes</Link>, the <Link to={links.step('fittings')}>fittings</Link> or the{' '}
              <Link to={links.step('devices')}>meter and devices</Link>; the supply, the elevations and the fixtures stay as issued.
            </p>
          ) : null}
        </Section>
        <DecisionPanel ids={ids} fieldChange={fieldChange} draft={draft} isAuthor={isAuthor} isDesigner={isDesigner} />
      </div>
      <Section title="Side by side with the issued revision">
        {draft.state !== 'saved' ? (
          <p className="mb-3 text-sm font-semibold" role="status">
            Showing the last saved field change; your latest edit is being saved.
          </p>
        ) : null}
        {comparison.isError ? (
          <ErrorView error={comparison.error} onRetry={() => void comparison.refetch()} what="the side by side" />
        ) : !comparison.data ? (
          <Loading label="Computing both sides…" />
        ) : (
          <ComparisonSections comparison={comparison.data} />
        )}
      </Section>
      <AttachmentsPanel ids={ids} fieldChange={fieldChange} isAuthor={isAuthor} />
      <Section title="Cautions" headingLevel={3}>
        <ul className="list-disc pl-5 text-sm" data-testid="cautions">
          <li>
            A field change is checked on the issued design’s own assumptions (supply, demand, elevations). The designer of record decides; nothing is built on a
            proposal alone.
          </li>
          <li>Check each substitute’s loss against the manufacturer’s data for the product actually installed (insert fittings narrow PEX further).</li>
          {CAUTIONS.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </Section>
    </div>
  );
}
