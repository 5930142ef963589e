import { ErrorView } from '../../../components/errors/error-view';
import { Section } from '../../../components/ui/card';
import { Loading } from '../../../components/ui/loading';
import type { RevisionCompare } from '../../../shared/api/reviewLoop';
import type { ComparisonResponse } from '../../../shared/api/fieldChanges';
import { ChangedElements, ComparisonVerdict } from '../../field-changes/components/comparison-view';
import { signed, stepOf, withUnit } from '../../../shared/format/quantity';
import { useAnswers } from '../api/get-answers';
import { describeItem } from './review-items';
import type { ItemCatalog } from './review-items';

type Fixture = RevisionCompare['fixtures'][number];

/** A margin that moved by at least the shown precision (the unit's last printed digit), or a verdict that flipped. */
const changed = (f: Fixture, unit: string) => f.difference === null || Math.abs(f.difference) >= stepOf(unit) / 2 || f.issuedPass !== f.newPass;

function FixtureRows({ fixtures, testId, unit: U }: { fixtures: Fixture[]; testId: string; unit: string }) {
  return (
    <table className="w-full min-w-[36rem] text-sm" data-testid={testId}>
      <thead>
        <tr className="border-b-2 border-rule text-left">
          <th scope="col" className="py-1 pr-2">
            Checked fixture
          </th>
          <th scope="col" className="py-1 pr-2 text-right">
            Margin then
          </th>
          <th scope="col" className="py-1 pr-2 text-right">
            Margin now
          </th>
          <th scope="col" className="py-1 text-right">
            Difference
          </th>
        </tr>
      </thead>
      <tbody>
        {fixtures.map((f) => (
          <tr key={f.id} className="border-b border-rule">
            <th scope="row" className="py-1 pr-2 text-left font-normal">
              {f.label}
              {f.newPass === false ? <span className="ml-1 text-xs font-semibold text-fault">⚠ short</span> : null}
            </th>
            <td className="py-1 pr-2 text-right tabular-nums">{signed(f.issuedMargin, U)}</td>
            <td className="py-1 pr-2 text-right tabular-nums">{signed(f.newMargin, U)}</td>
            <td className="py-1 text-right tabular-nums">{signed(f.difference, U)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/**
 * On a revision issued after a returned review: what changed since the returned revision (changed
 * rows first, in words such as "fittings 1× … → 5× …", unchanged fixtures folded) and the designer's
 * answer to each comment. Nothing when the revision answers no review.
 */
export function ReviewAnswersPanel({
  projectId,
  systemId,
  revisionId,
  catalog,
}: {
  projectId: string;
  systemId: string;
  revisionId: string;
  catalog?: ItemCatalog;
}) {
  const answers = useAnswers(projectId, systemId, revisionId);
  if (answers.isPending) return <Loading label="Looking for the answers to an earlier review…" />;
  if (answers.isError) return <ErrorView error={answers.error} onRetry={() => void answers.refetch()} what="the answers to the earlier review" />;
  if (!answers.data) return null;
  const { compare, reviews } = answers.data;
  const n = compare.returnedRevision.number;
  const u = compare.units.pressure;
  const moved = compare.fixtures.filter((f) => changed(f, u));
  const still = compare.fixtures.filter((f) => !changed(f, u));
  // the field-change views take the same comparison; this one is against the returned revision
  const asComparison: ComparisonResponse = { ...compare, fieldChangeId: '', baseRevision: compare.returnedRevision };
  return (
    <Section title={`Answers to the review of revision ${n}`} headingLevel={3}>
      <div className="flex flex-col gap-4" data-testid="review-answers">
        <p className="max-w-prose text-sm text-ink-soft">
          This revision was issued after revision {n} was returned. Below: what changed since revision {n}, then each comment with the designer’s reply.
        </p>
        <ComparisonVerdict comparison={asComparison} />
        <div>
          <h4 className="font-semibold">What changed since revision {n}</h4>
          {compare.changes.length ? (
            <ul className="mt-1 list-disc pl-5" data-testid="answers-changes">
              {compare.changes.map((c) => (
                <li key={`${c.elementType}-${c.elementId}`}>{c.text}</li>
              ))}
            </ul>
          ) : (
            <p className="text-ink-soft">No segment or device differs from revision {n}.</p>
          )}
        </div>
        {compare.changes.length ? <ChangedElements comparison={asComparison} /> : null}
        <div className="overflow-x-auto">
          <h4 className="font-semibold">Margins at the checked fixtures ({u}): changed first</h4>
          {moved.length ? (
            <FixtureRows fixtures={moved} testId="answers-fixtures-changed" unit={u} />
          ) : (
            <p className="text-ink-soft">No margin moved by {withUnit(stepOf(u), u)} or more.</p>
          )}
          {still.length ? (
            <details className="mt-2">
              <summary className="cursor-pointer text-sm font-semibold">Unchanged fixtures ({still.length})</summary>
              <FixtureRows fixtures={still} testId="answers-fixtures-unchanged" unit={u} />
            </details>
          ) : null}
        </div>
        {reviews.map((r) => (
          <div key={r.id} data-testid={`answers-review-${r.id}`}>
            <h4 className="font-semibold">
              Comments by {r.reviewer.name} on revision {r.revisionNumber}, and the replies
            </h4>
            {r.comment ? <p className="whitespace-pre-wrap text-sm">Overall: {r.comment}</p> : null}
            <ul className="mt-1 flex flex-col gap-2">
              {r.items.map((item, i) => (
                <li key={item.id || i} className="rounded border-l-4 border-copper bg-paper px-3 py-2" data-testid="answered-item">
                  <p className="text-sm font-semibold">{describeItem(item.itemType, item.itemId, catalog)}</p>
                  <p className="whitespace-pre-wrap">{item.comment}</p>
                  <p className="mt-1 text-sm">
                    <span className="font-semibold">Reply: </span>
                    {item.reply ? (
                      <span className="whitespace-pre-wrap">{item.reply.text}</span>
                    ) : (
                      <span className="font-semibold text-caution">not answered</span>
                    )}
                  </p>
                </li>
              ))}
            </ul>
          </div>
        ))}
      </div>
    </Section>
  );
}
