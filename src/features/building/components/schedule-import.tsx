import { useState } from 'react';
import { useFormContext } from 'react-hook-form';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextAreaField } from '../../../components/ui/field';
import type { BuildingForm } from '../lib/form';
import { applySchedule, exportSchedule, fileProblem, previewSchedule, type SchedulePreview } from '../lib/schedule';

function download(text: string, name: string) {
  const url = URL.createObjectURL(new Blob([text], { type: 'text/csv' }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.click();
  URL.revokeObjectURL(url);
}

/**
 * A fixture schedule pasted or uploaded (CSV, or a range copied from a spreadsheet): a preview
 * of every row's match or error; the unit types change only on "Apply".
 */
export function ScheduleImport() {
  const { getValues, setValue } = useFormContext<BuildingForm>();
  const [text, setText] = useState('');
  const [preview, setPreview] = useState<SchedulePreview | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [applied, setApplied] = useState<string | null>(null);
  const show = (t: string) => {
    setApplied(null);
    setPreview(previewSchedule(t, getValues('unitTypes')));
  };
  const onFile = async (file: File | undefined) => {
    setPreview(null);
    setApplied(null);
    if (!file) return;
    const why = fileProblem(file);
    setProblem(why);
    if (why) return;
    const content = await file.text();
    setText(content);
    show(content);
  };
  const apply = () => {
    if (!preview) return;
    setValue('unitTypes', applySchedule(getValues('unitTypes'), preview), { shouldValidate: true });
    setApplied(`${preview.good} schedule row${preview.good === 1 ? '' : 's'} applied to the unit types.`);
    setPreview(null);
    setText('');
  };
  return (
    <details className="rounded-md border-2 border-rule p-3">
      <summary className="cursor-pointer font-semibold">Fixture schedule: import or export</summary>
      <div className="mt-3 flex flex-col gap-3">
        <p className="max-w-prose text-sm text-ink-soft">
          Columns floor, unit, fixture, count, occupancy (private when empty), with a header line. Write “typical” as the floor and a unit type’s name as the
          unit; fixtures in the trade’s words (“water closet, flush tank”, “lavatory”, “shower”, “kitchen sink”). Optional columns fill the fixture’s point:
          height (above the floor), length and size of its branch, check (yes).
        </p>
        <TextAreaField label="Paste a schedule (CSV or a spreadsheet range)" value={text} onChange={(e) => setText(e.target.value)} rows={5} />
        <div className="flex flex-wrap items-center gap-3">
          <Button variant="secondary" onClick={() => show(text)} disabled={text.trim() === ''}>
            Preview the schedule
          </Button>
          <label className="text-sm font-semibold">
            Or upload a CSV file{' '}
            <input
              type="file"
              accept=".csv,.tsv,.txt,text/csv,text/plain"
              aria-label="Upload a schedule file"
              onChange={(e) => void onFile(e.target.files?.[0])}
            />
          </label>
          <Button variant="quiet" onClick={() => download(exportSchedule(getValues('unitTypes')), 'fixture-schedule.csv')}>
            Export the unit types’ schedule
          </Button>
        </div>
        {problem ? (
          <Alert tone="fault" title="File refused">
            {problem}
          </Alert>
        ) : null}
        {applied ? (
          <p role="status" className="text-sm text-sound">
            {applied}
          </p>
        ) : null}
        {preview ? <SchedulePreviewTable preview={preview} onApply={apply} onCancel={() => setPreview(null)} /> : null}
      </div>
    </details>
  );
}

function SchedulePreviewTable({ preview, onApply, onCancel }: { preview: SchedulePreview; onApply: () => void; onCancel: () => void }) {
  const bad = preview.rows.filter((r) => r.error).length;
  return (
    <div className="flex flex-col gap-2" data-testid="schedule-preview">
      {preview.fileErrors.map((e) => (
        <Alert key={e} tone="fault" title="The schedule cannot be read">
          {e}
        </Alert>
      ))}
      {preview.rows.length > 0 ? (
        <table className="w-full text-sm">
          <thead>
            <tr className="text-left">
              <th scope="col">Line</th>
              <th scope="col">Floor</th>
              <th scope="col">Unit</th>
              <th scope="col">Fixture</th>
              <th scope="col">Count</th>
              <th scope="col">Match</th>
            </tr>
          </thead>
          <tbody>
            {preview.rows.map((r) => (
              <tr key={r.line} className="border-t border-rule align-top" data-testid={`schedule-line-${r.line}`}>
                <td className="pr-2">{r.line}</td>
                <td className="pr-2">{r.floor}</td>
                <td className="pr-2">{r.unit}</td>
                <td className="pr-2">{r.fixture}</td>
                <td className="pr-2">{r.count ?? '—'}</td>
                <td className={r.error ? 'text-fault' : 'text-sound'}>{r.error ? `⚠ ${r.error}` : `✓ ${r.matchedLabel}`}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
      <p className="text-sm">
        {preview.good} row{preview.good === 1 ? '' : 's'} ready{bad ? `, ${bad} with an error (not applied; correct them and preview again)` : ''}.
      </p>
      <div className="flex gap-2">
        <Button onClick={onApply} disabled={preview.good === 0 || bad > 0 || preview.fileErrors.length > 0}>
          Apply {preview.good} row{preview.good === 1 ? '' : 's'}
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </div>
  );
}
