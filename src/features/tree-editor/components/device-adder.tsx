import { useState } from 'react';
import type { SystemDocument } from '../../../engine';
import type { Catalog } from '../../systems/api/get-catalog';
import { deviceFromTemplate } from '../model';
import type { DocChange } from './tree-editor';

/** A device added on a segment from its row: a catalog template's curve at the segment's inlet (finished at the devices step). */
export function DeviceAdder({
  segmentId,
  segmentName,
  doc,
  catalog,
  locked,
  onChange,
}: {
  segmentId: string;
  segmentName: string;
  doc: SystemDocument;
  catalog: Catalog;
  locked: string | null;
  onChange: (change: DocChange) => void;
}) {
  const templates = catalog.deviceTemplates.filter((t) => deviceFromTemplate(doc, t, segmentId) !== null);
  const [template, setTemplate] = useState(templates[0]?.id ?? '');
  const [added, setAdded] = useState<string | null>(null);
  const here = doc.devices.filter((d) => d.segmentId === segmentId);
  if (!templates.length) return null;
  const t = templates.find((x) => x.id === template);
  return (
    <div className="flex flex-wrap items-end gap-2 text-sm" title={locked ?? undefined}>
      <label className="flex flex-col text-xs font-semibold">
        Device on {segmentName}
        <select
          className="rounded border-2 border-rule-strong bg-surface px-1.5 py-0.5 text-sm"
          value={template}
          disabled={locked !== null}
          onChange={(ev) => setTemplate(ev.target.value)}
        >
          {templates.map((x) => (
            <option key={x.id} value={x.id}>
              {x.label}
            </option>
          ))}
        </select>
      </label>
      <button
        type="button"
        className="rounded-md border-2 border-standpipe bg-surface px-2 py-0.5 text-sm font-semibold text-standpipe disabled:opacity-60"
        disabled={locked !== null || !t}
        onClick={() => {
          if (!t) return;
          const device = deviceFromTemplate(doc, t, segmentId);
          if (!device) return;
          onChange((d) => ({ ...d, devices: [...d.devices, deviceFromTemplate(d, t, segmentId) ?? device] }));
          setAdded(`${device.label} added (source: ${t.source}).`);
        }}
      >
        Add this device here
      </button>
      <span className="text-xs text-ink-muted" data-testid={`devices-on-${segmentId}`}>
        {here.length ? `On this segment: ${here.map((d) => d.label).join(', ')}` : 'No device on this segment'}
      </span>
      {added ? (
        <span className="text-xs" aria-live="polite">
          {added}
        </span>
      ) : null}
    </div>
  );
}
