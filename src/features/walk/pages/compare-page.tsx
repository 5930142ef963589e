import { Link, useParams, useSearchParams } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { Section } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/field';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { useDocumentTitle } from '../../../hooks/use-document-title';
import { useCompareRevisions } from '../../systems/api/compare-revisions';
import { useSystem } from '../../systems/api/get-system';
import { fixtureVerdict, revisionVerdict, VerdictMark } from '../../systems/components/verdict-mark';
import { signed } from '../../../shared/format/quantity';
import { walkPaths } from '../paths';

/** Two revisions side by side: every checked fixture's margin in A and B and the difference; what segments changed. */
export function ComparePage() {
  const { projectId = '', systemId = '' } = useParams();
  const [search, setSearch] = useSearchParams();
  const a = search.get('a') ?? '';
  const b = search.get('b') ?? '';
  const system = useSystem(projectId, systemId);
  const compare = useCompareRevisions(projectId, systemId, a, b);
  useDocumentTitle('Compare revisions');

  if (system.isError) return <ErrorView error={system.error} onRetry={() => void system.refetch()} what="this system" />;
  if (!system.data) return <Loading label="Loading the system…" />;
  const options = [{ value: '', label: 'Choose…' }, ...system.data.revisions.map((r) => ({ value: r.id, label: `Revision ${r.number} (${r.status})` }))];
  const pick = (key: 'a' | 'b', value: string) => {
    const next = new URLSearchParams(search);
    if (value) next.set(key, value);
    else next.delete(key);
    setSearch(next);
  };
  const data = compare.data;
  const u = data?.pressureUnit ?? '';

  return (
    <>
      <p className="text-sm">
        <Link to={walkPaths.system.getHref(projectId, systemId)}>{system.data.system.name}</Link>
      </p>
      <PageHeader title="Compare revisions" subtitle={system.data.system.name} />
      <div className="mb-6 flex flex-wrap gap-4">
        <SelectField label="Revision A (before)" options={options} value={a} onChange={(ev) => pick('a', ev.target.value)} />
        <SelectField label="Revision B (after)" options={options} value={b} onChange={(ev) => pick('b', ev.target.value)} />
      </div>
      {!a || !b ? <p className="text-ink-soft">Choose two revisions.</p> : null}
      {compare.isError ? <ErrorView error={compare.error} onRetry={() => void compare.refetch()} what="the comparison" /> : null}
      {a && b && compare.isPending ? <Loading label="Comparing…" /> : null}
      {data ? (
        <div className="flex flex-col gap-6">
          <p className="flex flex-wrap items-center gap-4" data-testid="compare-verdicts">
            <span>
              Revision {data.a.number}: <VerdictMark verdict={revisionVerdict(data.a.verdict)} />
            </span>
            <span>
              Revision {data.b.number}: <VerdictMark verdict={revisionVerdict(data.b.verdict)} />
            </span>
          </p>
          <Section title={`Checked fixtures: revision ${data.a.number} → revision ${data.b.number}`}>
            <table className="w-full text-sm" data-testid="compare-fixtures">
              <caption className="sr-only">Margin of every checked fixture in both revisions</caption>
              <thead>
                <tr className="border-b-2 border-rule text-left">
                  <th scope="col" className="py-1 pr-3">
                    Fixture
                  </th>
                  <th scope="col" className="py-1 pr-3 text-right">
                    Margin A ({u})
                  </th>
                  <th scope="col" className="py-1 pr-3">
                    A
                  </th>
                  <th scope="col" className="py-1 pr-3 text-right">
                    Margin B ({u})
                  </th>
                  <th scope="col" className="py-1 pr-3">
                    B
                  </th>
                  <th scope="col" className="py-1 text-right">
                    Difference B − A
                  </th>
                </tr>
              </thead>
              <tbody>
                {data.fixtures.map((f) => (
                  <tr key={f.id} className="border-b border-rule" data-testid={`compare-${f.id}`}>
                    <th scope="row" className="py-1 pr-3 text-left font-normal">
                      {f.label}
                    </th>
                    <td className="py-1 pr-3 text-right tabular-nums">{f.marginA === null ? 'not in A' : signed(f.marginA, u)}</td>
                    <td className="py-1 pr-3">
                      <VerdictMark verdict={fixtureVerdict(f.passA, data.a.verdict.status)} />
                    </td>
                    <td className="py-1 pr-3 text-right tabular-nums">{f.marginB === null ? 'not in B' : signed(f.marginB, u)}</td>
                    <td className="py-1 pr-3">
                      <VerdictMark verdict={fixtureVerdict(f.passB, data.b.verdict.status)} />
                    </td>
                    <td className="py-1 text-right tabular-nums">{f.delta === null ? '—' : signed(f.delta, u)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </Section>
          <Section title="Segments that changed">
            {data.segments.length === 0 ? (
              <p className="text-ink-soft">No segment differs between the two revisions.</p>
            ) : (
              <ul className="list-disc pl-5 text-sm" data-testid="compare-segments">
                {data.segments.map((s) => (
                  <li key={s.id}>
                    <strong>{s.id}</strong>: {s.change}
                    {s.fields.length ? ` (${s.fields.join(', ')})` : ''}
                  </li>
                ))}
              </ul>
            )}
            <p className="mt-2 text-xs text-ink-muted">{data.fixtures.length} fixture(s) compared.</p>
          </Section>
        </div>
      ) : null}
    </>
  );
}
