import { memo, useCallback, useEffect, useId, useLayoutEffect, useMemo, useRef, useState } from 'react';
import type { KeyboardEvent, MouseEvent, ReactNode } from 'react';
import { useVirtualizer } from '@tanstack/react-virtual';
import { cx } from '../../../components/ui/cx';
import type { Analysis, SegmentResult, SystemDocument, UnitSystem } from '../../../engine';
import { UNIT_LABELS } from '../../../engine';
import type { Catalog } from '../../systems/api/get-catalog';
import type { ProjectCatalog } from '../../catalog/api/get-project-catalog';
import { matchProjectPipe, pipeFromProjectEntry, projectEntryIdOf, projectOptionValue } from '../../catalog/lib/apply-entries';
import type { SegmentFlagValues } from '../../walk/components/segment-flags';
import { num, signed } from '../../../shared/format/quantity';
import { sizeChoices } from '../../walk/lib/sizes';
import type { HeldValue } from '../../walk/draft/use-draft';
import { fittingsSummary, lossOf, setCustomPipe, setLength, setMaterial, setRise, treeRows, visibleLines } from '../model';
import type { TreeLine, TreeRow } from '../model';
import type { EditPolicy } from '../policy';
import { NumberCell, shownNumber } from './number-cell';
import { BulkBar } from './bulk-bar';
import { columnNames, DESCRIBED_COLUMNS, type ColumnNames, type DescribedColumn } from '../columns';

/** Above this many segments the rows are virtualised (only those near the window are in the page). */
export const VIRTUALISE_AT = 150;
/**
 * A row's height, px: one line of cells (a select or box of text-sm, 20 px, with its padding and
 * border, 28 px, in the row's 4 px padding, and the row's 1 px rule). Fixed, so a virtualised
 * list places rows without measuring them; only the open row (its details under it) is measured.
 */
export const ROW_HEIGHT = 38;
/** The open row's height before it is measured, px (its details take a few hundred pixels). */
const OPEN_ROW_ESTIMATE = 480;

export type DocChange = (doc: SystemDocument) => SystemDocument;

export interface TreeEditorProps {
  document: SystemDocument;
  analysis: Analysis | null;
  policy: EditPolicy;
  catalog: Catalog;
  project: ProjectCatalog;
  onChange: (change: DocChange) => void;
  /** values typed that did not reach the document (shown by the save bar as not saved) */
  reportHeld?: (key: string, values: HeldValue[]) => void;
  flagsOf: (segmentId: string) => SegmentFlagValues;
  /** `segment-<id>` in the walk, `pipe-<id>` in a field change */
  testIdPrefix?: string;
  /** a field change: the issued document and its analysis, shown beside each changed row */
  baseline?: { document: SystemDocument; analysis: Analysis | null };
  /** what opens under the active row (its details: fixtures, fittings, removal …) */
  renderDetail?: (row: TreeRow) => ReactNode;
  /** the row opened first */
  initialActive?: string | null;
  /** set by the composition to open a row (e.g. a segment just added) */
  activeRequest?: { id: string; at: number } | null;
  label: string;
}

/**
 * The segment's name stays at the left edge while the grid scrolls sideways, covering what passes
 * under it (the selection box too) with the row's own opaque colour. One sticky cell a row: each
 * is a layer of its own to the compositor, so no more than needed.
 */
const STICKY_NAME = 'sticky left-0 z-10 bg-inherit';

const CELL =
  'w-full min-w-0 rounded border-2 border-rule-strong bg-surface px-1.5 py-0.5 text-sm text-ink aria-[invalid=true]:border-fault disabled:bg-paper-deep';

/**
 * The columns, in order: their header, width and whether the keyboard stops at them. The editing
 * columns are named by the segment's description (columns.ts); the others show results.
 */
function columnsOf(hasFloors: boolean, units: (typeof UNIT_LABELS)[UnitSystem], names: Record<DescribedColumn, ColumnNames>) {
  return [
    { key: 'select', header: <span className="sr-only">Selected</span>, width: '1.75rem' },
    { key: 'name', header: names.name.header, width: 'minmax(11rem,1.4fr)' },
    { key: 'ends', header: 'From → to', width: 'minmax(9rem,1fr)' },
    { key: 'material', header: names.material.header, width: '9.5rem' },
    { key: 'size', header: names.size.header, width: '8.5rem' },
    { key: 'length', header: names.length.header, width: '5.5rem' },
    { key: 'rise', header: names.rise.header, width: '5.5rem' },
    ...(hasFloors ? [{ key: 'floor', header: 'Floor', width: '5rem' }] : []),
    { key: 'fittings', header: names.fittings.header, width: 'minmax(8rem,1fr)' },
    { key: 'flow', header: `Flow (${units.flow})`, width: '5rem' },
    { key: 'velocity', header: `Velocity (${units.velocity})`, width: '5.5rem' },
    { key: 'loss', header: `Loss (${units.pressure})`, width: '6rem' },
    { key: 'flags', header: 'Flags', width: 'minmax(7rem,1fr)' },
  ] as const;
}
/** Keyboard columns (data-col): 0 select, 1 name, 2 material, 3 size, 4 length, 5 rise. */
const COLS = 6;

interface RowProps {
  id: string;
  depth: number;
  /** segments in its branch below it */
  below: number;
  line: number;
  grid: string;
  prefix: string;
  name: string;
  ends: string;
  materialValue: string;
  materialOptions: readonly { value: string; label: string }[];
  size: string;
  sizeOptions: readonly { value: string; label: string }[];
  length: number | undefined;
  rise: number | undefined;
  riseLocked: string | null;
  floor: string | null;
  hasFloors: boolean;
  fittings: string;
  flow: string;
  velocity: string;
  loss: string;
  lossText: string | null;
  velocityText: string | null;
  fast: boolean;
  flagFast: string | null;
  flagFailing: string | null;
  flagMissing: string | null;
  changed: boolean;
  issuedText: string | null;
  selected: boolean;
  active: boolean;
  hasChildren: boolean;
  collapsed: boolean;
  hiddenBelow: number;
  lockMaterial: string | null;
  lockSize: string | null;
  lockLength: string | null;
  system: UnitSystem;
  /** the editing columns' names (the same object while the unit system stays) */
  names: Record<DescribedColumn, ColumnNames>;
  /** the element holding each editing column's help, by column (its cells' aria-describedby) */
  helpIds: Readonly<Partial<Record<DescribedColumn, string>>>;
  detail: ReactNode;
  onRowClick: (id: string, ev: MouseEvent) => void;
  onToggleSelect: (id: string) => void;
  onToggleCollapse: (id: string) => void;
  onMaterial: (id: string, value: string) => void;
  onSize: (id: string, value: string) => void;
  onNumber: (cellKey: string, value: number | undefined) => void;
  onHeld: (cellKey: string, message: string | null) => void;
  measure?: (el: HTMLElement | null) => void;
  index?: number;
  /** a virtualised row: its editable cells show text until the pointer or the focus comes to the row */
  lean: boolean;
}

type Options = readonly { value: string; label: string }[];
/** The option a select shows for a value (the first, as the select itself would, when none matches). */
function chosenLabel(options: Options, value: string): string {
  return (options.find((o) => o.value === value) ?? options[0])?.label ?? '';
}

/**
 * One cell of a row: the grid's cell, its text placed as its column reads (`numeric`: figures
 * right-aligned in tabular digits; `text`: a line of small text cut with an ellipsis).
 */
function Cell(p: { kind?: 'control' | 'numeric' | 'text' | 'plain'; title?: string; testId?: string; className?: string; children?: ReactNode }) {
  const place = { control: '', numeric: 'pt-0.5 text-right tabular-nums', text: 'min-w-0 truncate pt-0.5 text-xs', plain: 'pt-0.5' }[p.kind ?? 'control'];
  return (
    <div role="gridcell" className={cx(place, p.className)} title={p.title} data-testid={p.testId}>
      {p.children}
    </div>
  );
}

/**
 * An editable cell of a row scrolled past, before anyone reaches it: its value as text in the box
 * of the control it stands for (same size, so nothing moves), focusable at its keyboard position.
 * A select or a text box is a small document of its own to lay out; a list scrolled one screen a
 * frame replaces every row it shows, so its rows show text until the pointer or the focus comes.
 */
function ShownValue(p: { text: string; col: number; row: number; locked: string | null }) {
  return (
    <span
      tabIndex={0}
      className={cx(CELL, 'block truncate', p.locked !== null && 'bg-paper-deep')}
      data-col={p.col}
      data-row={p.row}
      title={p.locked ?? undefined}
    >
      {p.text || '\u00a0'}
    </span>
  );
}

/** A choice cell (material, size): its select once the row is live, its chosen label as text before. */
function ChoiceCell(p: {
  live: boolean;
  label: string;
  value: string;
  options: Options;
  locked: string | null;
  /** the id of the column's help */
  describedBy?: string;
  col: number;
  row: number;
  onChoose: (value: string) => void;
}) {
  return (
    <Cell>
      {p.live ? (
        <select
          aria-label={p.label}
          aria-describedby={p.describedBy}
          className={CELL}
          value={p.value}
          disabled={p.locked !== null}
          title={p.locked ?? undefined}
          aria-description={p.locked ?? undefined}
          data-col={p.col}
          data-row={p.row}
          onChange={(ev) => p.onChoose(ev.target.value)}
        >
          {p.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      ) : (
        <ShownValue text={chosenLabel(p.options, p.value)} col={p.col} row={p.row} locked={p.locked} />
      )}
    </Cell>
  );
}

/** One segment's line; memoised on plain values, so an edit re-renders only the rows whose values changed. */
const Row = memo(function Row(p: RowProps) {
  const id = p.id;
  // A virtualised row shows its values as text until the pointer or the focus comes to it (see
  // ShownValue); then its controls, with their full lists of choices, before any choice is made.
  const [warm, setWarm] = useState(false);
  const live = !p.lean || warm;
  const rowEl = useRef<HTMLDivElement | null>(null);
  const { measure } = p;
  const setRowEl = useCallback(
    (el: HTMLDivElement | null) => {
      rowEl.current = el;
      measure?.(el);
    },
    [measure],
  );
  // the column whose shown value took the focus: its control takes it once made
  const refocus = useRef<string | null>(null);
  const wake = live
    ? undefined
    : (ev: { type: string; target: EventTarget }) => {
        if (ev.type === 'focus') refocus.current = (ev.target as HTMLElement).dataset.col ?? null;
        setWarm(true);
      };
  useLayoutEffect(() => {
    const col = refocus.current;
    refocus.current = null;
    if (warm && col !== null) rowEl.current?.querySelector<HTMLElement>(`[data-col="${col}"]`)?.focus();
  }, [warm]);
  return (
    <div
      role="row"
      aria-rowindex={p.line + 2}
      aria-selected={p.selected}
      data-testid={`${p.prefix}-${id}`}
      data-changed={p.changed || undefined}
      data-active={p.active || undefined}
      data-index={p.index}
      ref={setRowEl}
      onPointerEnter={wake}
      onFocus={wake}
      // a row of text only is laid out and painted on its own (nothing in it floats out of it)
      style={p.detail ? undefined : live ? { height: ROW_HEIGHT } : { height: ROW_HEIGHT, contain: 'strict' }}
      // opaque colours, so the sticky cells (bg-inherit) hide what scrolls under them: the open row is standpipe-soft at 40 % over the white surface.
      // `relative` (no z-index: a cell's message still shows over the rows below) gives the row a paint layer of its
      // own in Chromium, whose painting is kept and reused while the row does not change: an edit repaints its rows, not the page
      className={cx('relative border-b border-rule', p.active ? 'bg-[#f1f6f7]' : p.selected ? 'bg-paper-deep' : 'bg-surface')}
    >
      <div className="grid items-start gap-x-2 py-1 text-sm" style={{ gridTemplateColumns: p.grid }} onClick={(ev) => p.onRowClick(id, ev)}>
        <Cell kind="plain">
          <input
            type="checkbox"
            aria-label={`Select ${p.name}`}
            checked={p.selected}
            data-col={0}
            data-row={p.line}
            onChange={() => p.onToggleSelect(id)}
            onClick={(ev) => ev.stopPropagation()}
          />
        </Cell>
        <Cell className={cx(STICKY_NAME, 'min-w-0')}>
          <span className="flex min-w-0 items-start gap-1" style={{ paddingLeft: `${Math.min(p.depth - 1, 12) * 0.75}rem` }}>
            {p.hasChildren ? (
              <button
                type="button"
                className="w-5 shrink-0 text-standpipe"
                aria-expanded={!p.collapsed}
                aria-label={`${p.collapsed ? 'Expand' : 'Collapse'} the branch of ${p.name} (${p.below} below)`}
                onClick={(ev) => {
                  ev.stopPropagation();
                  p.onToggleCollapse(id);
                }}
              >
                <span aria-hidden="true">{p.collapsed ? '▸' : '▾'}</span>
              </button>
            ) : (
              <span className="w-5 shrink-0" aria-hidden="true" />
            )}
            <button
              type="button"
              className="min-w-0 truncate text-left font-semibold"
              title={p.name}
              data-col={1}
              data-row={p.line}
              aria-label={`Open ${p.name}`}
              aria-pressed={p.active}
            >
              {p.name}
            </button>
            {p.collapsed && p.hiddenBelow > 0 ? (
              <span className="shrink-0 text-xs text-ink-muted" data-testid="hidden-count">
                +{p.hiddenBelow}
              </span>
            ) : null}
          </span>
        </Cell>
        <Cell kind="text" className="text-ink-soft" title={p.issuedText ? `${p.ends}; issued: ${p.issuedText}` : p.ends}>
          {p.changed ? <span className="mr-1 rounded border border-caution px-1 font-semibold text-ink">changed</span> : null}
          {p.ends}
          {p.issuedText ? <span className="text-ink-muted"> · Issued: {p.issuedText}</span> : null}
        </Cell>
        <ChoiceCell
          live={live}
          label={p.names.material.cell(p.name)}
          describedBy={p.helpIds.material}
          value={p.materialValue}
          options={p.materialOptions}
          locked={p.lockMaterial}
          col={2}
          row={p.line}
          onChoose={(v) => p.onMaterial(id, v)}
        />
        <ChoiceCell
          live={live}
          label={p.names.size.cell(p.name)}
          describedBy={p.helpIds.size}
          value={p.size}
          options={p.sizeOptions}
          locked={p.lockSize}
          col={3}
          row={p.line}
          onChoose={(v) => p.onSize(id, v)}
        />
        <Cell>
          {live ? (
            <NumberCell
              label={p.names.length.cell(p.name)}
              describedBy={p.helpIds.length}
              value={p.length}
              kind="length"
              system={p.system}
              optional={false}
              locked={p.lockLength}
              cellKey={`${id}\u0000length`}
              col={4}
              row={p.line}
              onCommit={p.onNumber}
              onHeld={p.onHeld}
            />
          ) : (
            <ShownValue text={shownNumber(p.length)} col={4} row={p.line} locked={p.lockLength} />
          )}
        </Cell>
        <Cell>
          {live ? (
            <NumberCell
              label={p.names.rise.cell(p.name)}
              describedBy={p.helpIds.rise}
              value={p.rise}
              kind="rise"
              system={p.system}
              optional
              locked={p.riseLocked}
              cellKey={`${id}\u0000rise`}
              col={5}
              row={p.line}
              onCommit={p.onNumber}
              onHeld={p.onHeld}
            />
          ) : (
            <ShownValue text={shownNumber(p.rise)} col={5} row={p.line} locked={p.riseLocked} />
          )}
        </Cell>
        {p.hasFloors ? <Cell kind="plain">{p.floor ?? '—'}</Cell> : null}
        <Cell kind="text" title={p.fittings} testId={`${p.prefix}-fittings-${id}`}>
          {p.fittings}
        </Cell>
        <Cell kind="numeric">{p.flow}</Cell>
        <Cell kind="numeric" testId={`${p.prefix}-velocity-${id}`}>
          {p.velocityText ?? p.velocity}
          {p.fast ? <span className="font-semibold text-fault"> ▲</span> : null}
        </Cell>
        <Cell kind="numeric" testId={`${p.prefix}-loss-${id}`}>
          {p.lossText ?? p.loss}
        </Cell>
        <Cell
          className="min-w-0 truncate"
          title={
            [p.flagFast && `Velocity ${p.flagFast}`, p.flagFailing, p.flagMissing && `Incomplete: ${p.flagMissing}`].filter(Boolean).join('; ') || undefined
          }
        >
          <RowFlags fast={p.flagFast} failing={p.flagFailing} missing={p.flagMissing} />
        </Cell>
      </div>
      {p.detail ? (
        <div className="border-t border-rule bg-surface px-3 py-3" data-testid="row-detail">
          {p.detail}
        </div>
      ) : null}
    </div>
  );
});

/** The row's marks on one line (shape and words, never colour alone); the whole text is the cell's title. */
function RowFlags({ fast, failing, missing }: SegmentFlagValues) {
  if (!fast && !failing && !missing) return null;
  const mark = 'mr-1 rounded border px-1 text-xs font-semibold';
  return (
    <span data-testid="segment-flags" className="whitespace-nowrap">
      {fast ? (
        <span className={`${mark} border-fault bg-fault-soft text-fault`} data-flag="velocity">
          <span aria-hidden="true">▲ </span>Velocity {fast}
        </span>
      ) : null}
      {failing ? (
        <span className={`${mark} border-fault bg-fault-soft text-fault`} data-flag="failing">
          <span aria-hidden="true">▼ </span>
          {failing}
        </span>
      ) : null}
      {missing ? (
        <span className={`${mark} border-caution bg-caution-soft text-caution`} data-flag="incomplete">
          <span aria-hidden="true">○ </span>Incomplete: {missing}
        </span>
      ) : null}
    </span>
  );
}

const FloorLine = memo(function FloorLine({
  floorId,
  label,
  count,
  collapsed,
  onToggle,
}: {
  floorId: string;
  label: string;
  count: number;
  collapsed: boolean;
  onToggle: (id: string) => void;
}) {
  return (
    <div role="row" style={{ height: ROW_HEIGHT }} className="border-b-2 border-rule bg-paper-deep px-2 py-1" data-testid={`floor-${floorId || 'none'}`}>
      <div role="gridcell">
        <button type="button" className="font-semibold text-standpipe" aria-expanded={!collapsed} onClick={() => onToggle(floorId)}>
          <span aria-hidden="true">{collapsed ? '▸ ' : '▾ '}</span>
          {label} — {count} {count === 1 ? 'segment' : 'segments'}
        </button>
      </div>
    </div>
  );
});

const RISE_ON_FLOOR = 'Placed by its floor: change the floor on the building page, not a rise.';

const setNative = (el: HTMLInputElement | HTMLSelectElement, value: string) => {
  const proto = el instanceof HTMLSelectElement ? HTMLSelectElement.prototype : HTMLInputElement.prototype;
  Object.getOwnPropertyDescriptor(proto, 'value')!.set!.call(el, value);
  el.dispatchEvent(new Event(el instanceof HTMLSelectElement ? 'change' : 'input', { bubbles: true }));
};

/**
 * The compact editor of the pipe tree: one row per segment in tree order, collapsible by branch or
 * by floor, edited in place with the keyboard (arrows move, Enter or F2 edits, Escape cancels, Tab
 * moves on), a selection (click, shift-click, ctrl/cmd-click, a branch) edited in bulk, and long
 * lists virtualised. What may be changed is the policy's; a locked cell is shown read-only with
 * its reason.
 */
export function TreeEditor(props: TreeEditorProps) {
  const { document: doc, analysis, policy, catalog, project, onChange, reportHeld, flagsOf, baseline, renderDetail } = props;
  const prefix = props.testIdPrefix ?? 'segment';
  const sys = doc.unitSystem;
  const units = UNIT_LABELS[sys];
  const hasFloors = (doc.floors ?? []).length > 0;
  const names = useMemo(() => columnNames(sys), [sys]);
  const columns = columnsOf(hasFloors, units, names);
  // the help of each editing column, held once in its header and read out with each of its cells
  const helpPrefix = useId();
  const helpIds = useMemo(
    () =>
      Object.fromEntries(DESCRIBED_COLUMNS.filter((c) => names[c].hint).map((c) => [c, `${helpPrefix}-help-${c}`])) as Partial<Record<DescribedColumn, string>>,
    [names, helpPrefix],
  );
  const grid = columns.map((c) => c.width).join(' ');
  const rows = useMemo(() => treeRows(doc), [doc]);
  const [collapsed, setCollapsed] = useState<ReadonlySet<string>>(() => new Set());
  const [byFloor, setByFloor] = useState(false);
  const [floorsCollapsed, setFloorsCollapsed] = useState<ReadonlySet<string>>(() => new Set());
  const lines = useMemo(
    () => visibleLines(rows, collapsed, byFloor && hasFloors ? { floors: doc.floors ?? [], collapsed: floorsCollapsed } : null),
    [rows, collapsed, byFloor, hasFloors, doc.floors, floorsCollapsed],
  );
  const [selected, setSelected] = useState<ReadonlySet<string>>(() => new Set());
  const [active, setActive] = useState<string | null>(() => (props.initialActive === undefined ? (rows[0]?.id ?? null) : props.initialActive));
  const anchor = useRef<string | null>(null);
  // a row the composition opens (a segment just added)
  const request = props.activeRequest;
  useEffect(() => {
    if (request) setActive(request.id);
  }, [request]);

  /** a project material chosen on a row, waiting for its size (the document holds a pipe only once both are known) */
  const [pendingMaterial, setPendingMaterial] = useState<ReadonlyMap<string, string>>(() => new Map());
  const results = useMemo(() => new Map((analysis?.segments ?? []).map((s) => [s.id, s])), [analysis]);
  const before = useMemo(() => new Map((baseline?.analysis?.segments ?? []).map((s) => [s.id, s])), [baseline?.analysis]);
  const issued = useMemo(() => new Map((baseline?.document.segments ?? []).map((s) => [s.id, s])), [baseline?.document]);

  // `of` filters anew on each call: kept per catalog, so the material choices (a prop of every row) stay the same object
  const projectMaterials = useMemo(() => project.of('material'), [project]);
  const materialOptions = useMemo(
    () => [
      { value: '', label: 'Custom pipe (give its data)' },
      ...catalog.materials.map((m) => ({ value: m.id, label: m.label })),
      ...projectMaterials.map((m) => ({ value: projectOptionValue(m.id), label: `${m.label} — project` })),
    ],
    [catalog, projectMaterials],
  );
  const sizeOptionsCache = useMemo(() => new Map<string, { value: string; label: string }[]>(), [catalog, project, sys]); // eslint-disable-line react-hooks/exhaustive-deps
  const sizeOptionsOf = useCallback(
    (materialValue: string) => {
      let opts = sizeOptionsCache.get(materialValue);
      if (!opts) {
        const projectMaterial = project.find('material', projectEntryIdOf(materialValue));
        const sizes = projectMaterial ? projectMaterial.data.sizes : catalog.material(materialValue || undefined)?.data.sizes;
        opts = sizes
          ? sizeChoices(sizes, sys, units.diameter)
          : [{ value: '', label: materialValue === '' ? 'Custom pipe: see its data' : 'Choose a material first' }];
        sizeOptionsCache.set(materialValue, opts);
      }
      return opts;
    },
    [sizeOptionsCache, project, catalog, sys, units.diameter],
  );

  // ---- held values (typed, refused, not in the document)
  const heldKey = useId();
  const held = useRef(new Map<string, string>());
  const nameById = useMemo(() => new Map(rows.map((r) => [r.id, r.name])), [rows]);
  // read through a ref: the rows' callback stays the same object across edits (the rows are memoised on it)
  const nameByIdRef = useRef(nameById);
  nameByIdRef.current = nameById;
  const onHeld = useCallback(
    (cellKey: string, message: string | null) => {
      const had = held.current.get(cellKey);
      if (message === null) held.current.delete(cellKey);
      else held.current.set(cellKey, message);
      if (had === (message ?? undefined)) return;
      reportHeld?.(
        heldKey,
        [...held.current].map(([k, m]) => {
          const [segId, field] = k.split('\u0000');
          return { path: `segments.${segId}.${field}`, message: `${nameByIdRef.current.get(segId) ?? segId}, ${field}: ${m}` };
        }),
      );
    },
    [reportHeld, heldKey],
  );
  useEffect(() => () => reportHeld?.(heldKey, []), [reportHeld, heldKey]);

  // ---- edits (stable callbacks: the rows are memoised)
  const docRef = useRef(doc);
  docRef.current = doc;
  const policyRef = useRef(policy);
  policyRef.current = policy;
  // The composition's update may be a new function on each of its renders (the walk's is, after
  // every edit): the rows' callbacks call it through a ref, so they stay the same objects and an
  // edit re-renders only the rows whose values changed.
  const onChangeRef = useRef(onChange);
  onChangeRef.current = onChange;
  const change = useCallback((c: DocChange) => onChangeRef.current(c), []);
  const onNumber = useCallback(
    (cellKey: string, value: number | undefined) => {
      const [id, field] = cellKey.split('\u0000');
      if (field === 'length' && value !== undefined && !policyRef.current.locked.length) change((d) => setLength(d, id, value));
      if (field === 'rise' && !policyRef.current.locked.rise) change((d) => setRise(d, id, value));
    },
    [change],
  );
  const applyMaterial = useCallback(
    (ids: readonly string[], value: string) => {
      const entryId = projectEntryIdOf(value);
      if (entryId) {
        // a project material: its pipe is copied in once a size it has is chosen
        setPendingMaterial((m) => new Map([...m, ...ids.map((id) => [id, value] as const)]));
        return;
      }
      setPendingMaterial((m) => (ids.some((id) => m.has(id)) ? new Map([...m].filter(([k]) => !ids.includes(k))) : m));
      if (value === '') {
        // a custom pipe: the catalog reference goes, its own data is given in the row's details
        change(
          (d) => ({ ...d, segments: d.segments.map((s) => (ids.includes(s.id) ? (({ material: _m, size: _s, ...rest }) => rest)(s) : s)) }) as SystemDocument,
        );
        return;
      }
      change((d) => setMaterial(d, ids, value));
    },
    [change],
  );
  const pendingRef = useRef(pendingMaterial);
  pendingRef.current = pendingMaterial;
  const applySize = useCallback(
    (ids: readonly string[], size: string, materialValue?: string) => {
      const groups = new Map<string, string[]>();
      for (const id of ids) {
        const seg = docRef.current.segments.find((s) => s.id === id);
        const value = materialValue ?? pendingRef.current.get(id) ?? seg?.material ?? '';
        groups.set(value, [...(groups.get(value) ?? []), id]);
      }
      for (const [value, list] of groups) {
        const entry = project.find('material', projectEntryIdOf(value));
        if (entry) {
          const pipe = pipeFromProjectEntry(entry, size, sys);
          if (!pipe) continue;
          change((d) => setCustomPipe(d, list, pipe));
          setPendingMaterial((m) => new Map([...m].filter(([k]) => !list.includes(k))));
        } else if (value !== '') {
          change((d) => ({ ...d, segments: d.segments.map((s) => (list.includes(s.id) ? ({ ...s, material: value, size } as typeof s) : s)) }));
        }
      }
    },
    [change, project, sys],
  );
  const onMaterial = useCallback((id: string, value: string) => applyMaterial([id], value), [applyMaterial]);
  const onSize = useCallback((id: string, value: string) => applySize([id], value), [applySize]);

  // ---- selection
  const linesRef = useRef(lines);
  linesRef.current = lines;
  const onRowClick = useCallback((id: string, ev: MouseEvent) => {
    const target = ev.target as HTMLElement;
    // a click into an input or a select edits it; it does not change the selection
    if (target.closest('input, select, textarea')) return;
    if (ev.shiftKey && anchor.current) {
      const visible = linesRef.current.flatMap((l) => (l.kind === 'segment' ? [l.row] : []));
      const i = visible.findIndex((r) => r.id === anchor.current);
      const j = visible.findIndex((r) => r.id === id);
      const span = i < 0 || j < 0 ? [id] : visible.slice(Math.min(i, j), Math.max(i, j) + 1).map((r) => r.id);
      setSelected(new Set(span));
    } else if (ev.ctrlKey || ev.metaKey) {
      setSelected((s) => {
        const next = new Set(s);
        if (next.has(id)) next.delete(id);
        else next.add(id);
        return next;
      });
      anchor.current = id;
    } else {
      setSelected(new Set([id]));
      anchor.current = id;
      setActive((a) => (a === id && target.closest('[data-col="1"]') ? null : id));
    }
  }, []);
  const onToggleSelect = useCallback((id: string) => {
    setSelected((s) => {
      const next = new Set(s);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
    anchor.current = id;
  }, []);
  const onToggleCollapse = useCallback((id: string) => {
    setCollapsed((c) => {
      const next = new Set(c);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  }, []);
  const onToggleFloor = useCallback((id: string) => {
    setFloorsCollapsed((c) => {
      const next = new Set(c);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  }, []);

  // ---- keyboard: arrows move between cells, Enter/F2 edits, Escape cancels, Tab moves on (native)
  const gridRef = useRef<HTMLDivElement>(null);
  const editing = useRef<{ el: Element; value: string; editing: boolean } | null>(null);
  const virtual = lines.length > VIRTUALISE_AT;
  const scrollRef = useRef<HTMLDivElement>(null);
  const getItemKey = useCallback(
    (i: number) => {
      const l = lines[i];
      return l.kind === 'segment' ? l.row.id : `floor:${l.floorId}`;
    },
    [lines],
  );
  const setGridEl = useCallback(
    (el: HTMLDivElement | null) => {
      gridRef.current = el;
      scrollRef.current = virtual ? el : null;
    },
    [virtual],
  );
  const activeRef = useRef(active);
  activeRef.current = active;
  const virtualizer = useVirtualizer({
    count: virtual ? lines.length : 0,
    getScrollElement: () => scrollRef.current,
    // fixed heights: only the open row is measured (see ROW_HEIGHT)
    estimateSize: (i) => {
      const l = linesRef.current[i];
      return l?.kind === 'segment' && l.row.id === activeRef.current && renderDetail ? OPEN_ROW_ESTIMATE : ROW_HEIGHT;
    },
    // a few rows beyond each edge: every extra row is mounted on each jump of the list
    overscan: 4,
    // the same function while the lines stay: a new one makes the virtualizer lay out every line again
    getItemKey,
  });
  // another row opened or closed: the sizes measured before (the old open row's) no longer hold
  useEffect(() => {
    if (virtual) virtualizer.measure();
  }, [active, virtual, virtualizer]);
  const wantFocus = useRef<{ row: number; col: number } | null>(null);
  const focusCell = useCallback((row: number, col: number) => {
    const el = gridRef.current?.querySelector<HTMLElement>(`[data-row="${row}"][data-col="${col}"]`);
    if (el) {
      el.focus();
      return true;
    }
    return false;
  }, []);
  useEffect(() => {
    const want = wantFocus.current;
    if (want && focusCell(want.row, want.col)) wantFocus.current = null;
  });
  const move = (row: number, col: number) => {
    const count = linesRef.current.length;
    let r = Math.max(0, Math.min(count - 1, row));
    // skip floor headings going up or down
    const step = row < 0 ? 1 : row >= count ? -1 : Math.sign(row - (Number((window.document.activeElement as HTMLElement | null)?.dataset.row) || 0)) || 1;
    while (linesRef.current[r] && linesRef.current[r].kind !== 'segment') r += step;
    if (!linesRef.current[r]) return;
    const c = Math.max(0, Math.min(COLS - 1, col));
    if (!focusCell(r, c)) {
      wantFocus.current = { row: r, col: c };
      if (virtual) virtualizer.scrollToIndex(r, { align: 'auto' });
    }
  };
  const onFocus = (ev: React.FocusEvent) => {
    const el = ev.target as HTMLInputElement | HTMLSelectElement;
    if (!el.dataset?.col) return;
    editing.current = { el, value: 'value' in el ? el.value : '', editing: false };
  };
  const onKeyDown = (ev: KeyboardEvent) => {
    const el = ev.target as HTMLElement;
    const row = Number(el.dataset.row);
    const col = Number(el.dataset.col);
    if (el.dataset.col === undefined || Number.isNaN(row)) return;
    const state = editing.current?.el === el ? editing.current : (editing.current = { el, value: (el as HTMLInputElement).value ?? '', editing: false });
    const isInput = el instanceof HTMLInputElement && el.type === 'text';
    const isSelect = el instanceof HTMLSelectElement;
    if (ev.key === 'Enter' || ev.key === 'F2') {
      if (isInput || isSelect) {
        ev.preventDefault();
        if (state.editing && ev.key === 'Enter') {
          state.editing = false;
          state.value = (el as HTMLInputElement).value;
          return;
        }
        state.editing = true;
        if (isInput) (el as HTMLInputElement).select();
        if (isSelect) (el as HTMLSelectElement & { showPicker?: () => void }).showPicker?.();
      }
      return;
    }
    if (ev.key === 'Escape') {
      if ((isInput || isSelect) && (el as HTMLInputElement).value !== state.value) {
        ev.preventDefault();
        setNative(el as HTMLInputElement, state.value);
      }
      state.editing = false;
      return;
    }
    if (ev.key === 'ArrowDown' || ev.key === 'ArrowUp') {
      if (isSelect && state.editing) return;
      ev.preventDefault();
      state.editing = false;
      move(row + (ev.key === 'ArrowDown' ? 1 : -1), col);
      return;
    }
    if (ev.key === 'ArrowLeft' || ev.key === 'ArrowRight') {
      if (isInput && state.editing) {
        const input = el as HTMLInputElement;
        const atEdge = ev.key === 'ArrowLeft' ? input.selectionStart === 0 && input.selectionEnd === 0 : input.selectionStart === input.value.length;
        if (!atEdge) return;
      }
      ev.preventDefault();
      state.editing = false;
      move(row, col + (ev.key === 'ArrowRight' ? 1 : -1));
      return;
    }
    // typing into a number box starts editing it
    if (isInput && ev.key.length === 1 && !ev.ctrlKey && !ev.metaKey) state.editing = true;
  };

  // ---- what each row shows
  // the open row's details: made again when the document or the composition changes, not on a scroll
  const activeDetail = useMemo(() => {
    const row = active && renderDetail ? rows.find((r) => r.id === active) : undefined;
    return row && renderDetail ? renderDetail(row) : null;
  }, [active, rows, renderDetail]);
  // Recycled slots: a line keeps slot (index mod slots) while it stays in the window, and a line
  // scrolled in takes the slot of one scrolled out, so React updates that row's elements in place
  // instead of removing ~60 elements and making ~60 new ones per row (the cost of a scroll frame).
  // `slots` is the most lines the window has held: consecutive indices then never share a slot, and
  // a jump of a whole screen (every line replaced) finds all but (slots − window) of its slots made.
  const virtualItems = virtual ? virtualizer.getVirtualItems() : [];
  const slotsRef = useRef(0);
  slotsRef.current = Math.max(slotsRef.current, virtualItems.length);
  const slots = slotsRef.current;
  const slotted = virtual;
  const shownCount = useMemo(() => lines.reduce((n, l) => n + (l.kind === 'segment' ? 1 : 0), 0), [lines]);
  const lengthLock = policy.locked.length;
  // `slotted`: the line fills a recycled slot of the virtualised list, so its elements are not keyed by the segment
  const renderLine = (line: TreeLine, i: number, measure?: (el: HTMLElement | null) => void, slotted = false) => {
    if (line.kind === 'floor')
      return (
        <FloorLine
          key={slotted ? 'floor' : `floor:${line.floorId}`}
          floorId={line.floorId}
          label={line.label}
          count={line.count}
          collapsed={line.collapsed}
          onToggle={onToggleFloor}
        />
      );
    const r = line.row;
    const s = doc.segments[r.index];
    const res: SegmentResult | undefined = results.get(r.id);
    const flags = flagsOf(r.id);
    const match = !s.material && s.custom ? matchProjectPipe(s.custom, projectMaterials, sys) : null;
    const materialValue = pendingMaterial.get(r.id) ?? (match ? projectOptionValue(match.entryId) : (s.material ?? ''));
    const size = pendingMaterial.has(r.id) ? '' : match ? match.sizeKey : (s.size ?? '');
    const riseLocked = policy.locked.rise ?? (r.toOnFloor ? RISE_ON_FLOOR : null);
    const was = issued.get(r.id);
    const b = before.get(r.id);
    const changed = was
      ? was.material !== s.material ||
        was.size !== s.size ||
        was.length !== s.length ||
        JSON.stringify(was.fittings) !== JSON.stringify(s.fittings) ||
        JSON.stringify(was.custom) !== JSON.stringify(s.custom)
      : false;
    const lossNow = lossOf(res);
    const lossBefore = lossOf(b);
    return (
      <Row
        key={slotted ? 'row' : r.id}
        id={r.id}
        depth={r.depth}
        below={r.below}
        line={i}
        grid={grid}
        prefix={prefix}
        name={r.name}
        ends={`${r.fromName} → ${r.toName}`}
        materialValue={materialValue}
        materialOptions={materialOptions}
        size={size}
        sizeOptions={sizeOptionsOf(materialValue)}
        length={s.length}
        rise={s.rise}
        riseLocked={riseLocked}
        floor={r.floorLabel}
        hasFloors={hasFloors}
        fittings={fittingsSummary(s.fittings)}
        flow={num(res?.designFlow, units.flow)}
        velocity={num(res?.velocity, units.velocity)}
        loss={num(lossNow, units.pressure)}
        lossText={
          baseline
            ? `${num(lossBefore, units.pressure)} → ${num(lossNow, units.pressure)} (${lossBefore !== undefined && lossNow !== undefined ? signed(lossNow - lossBefore, units.pressure) : '—'})`
            : null
        }
        velocityText={baseline ? `${num(b?.velocity, units.velocity)} → ${num(res?.velocity, units.velocity)}` : null}
        fast={res?.velocityPass === false}
        flagFast={flags.fast}
        flagFailing={flags.failing}
        flagMissing={flags.missing}
        changed={changed}
        issuedText={
          was
            ? `${was.material ? `${catalog.material(was.material)?.label ?? was.material}, ${was.size ?? '—'}` : 'custom pipe'}, ${num(was.length, units.length)} ${units.length}`
            : null
        }
        selected={selected.has(r.id)}
        active={active === r.id}
        hasChildren={r.below > 0}
        collapsed={collapsed.has(r.id)}
        hiddenBelow={line.hiddenBelow}
        lockMaterial={policy.locked.material}
        lockSize={policy.locked.size}
        lockLength={lengthLock}
        system={sys}
        names={names}
        helpIds={helpIds}
        detail={active === r.id ? activeDetail : null}
        onRowClick={onRowClick}
        onToggleSelect={onToggleSelect}
        onToggleCollapse={onToggleCollapse}
        onMaterial={onMaterial}
        onSize={onSize}
        onNumber={onNumber}
        onHeld={onHeld}
        // only the open row is measured; the others have the fixed ROW_HEIGHT
        measure={active === r.id ? measure : undefined}
        index={measure ? i : undefined}
        lean={slotted}
      />
    );
  };

  const selectBranch = (id: string) => {
    const at = rows.findIndex((r) => r.id === id);
    if (at >= 0) setSelected(new Set(rows.slice(at, at + rows[at].below + 1).map((r) => r.id)));
  };
  const expandAll = () => setCollapsed(new Set());
  const collapseAll = () => setCollapsed(new Set(rows.filter((r) => r.below > 0 && r.depth > 1).map((r) => r.id)));

  return (
    <div className="flex flex-col gap-2" data-testid="tree-editor" data-policy={policy.id}>
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <span aria-live="polite" data-testid="tree-counts">
          {rows.length} {rows.length === 1 ? 'segment' : 'segments'}, {shownCount} shown
        </span>
        <button type="button" className="text-standpipe underline" onClick={collapseAll}>
          Collapse branches
        </button>
        <button type="button" className="text-standpipe underline" onClick={expandAll}>
          Expand all
        </button>
        {hasFloors ? (
          <label className="flex items-center gap-1">
            <input type="checkbox" checked={byFloor} onChange={(ev) => setByFloor(ev.target.checked)} /> Group by floor
          </label>
        ) : null}
        {active ? (
          <button type="button" className="text-standpipe underline" onClick={() => selectBranch(active)}>
            Select the branch of {nameById.get(active) ?? active}
          </button>
        ) : null}
      </div>
      <BulkBar
        selected={selected}
        policy={policy}
        doc={doc}
        catalog={catalog}
        materialOptions={materialOptions}
        sizeOptionsOf={sizeOptionsOf}
        onMaterial={(ids, v) => applyMaterial(ids, v)}
        onSize={(ids, v, m) => applySize(ids, v, m)}
        onChange={onChange}
        onClear={() => setSelected(new Set())}
        pendingMaterial={pendingMaterial}
      />
      {/* One box scrolls both ways (a virtualised list's rows are placed in it): the heading row stays
          at its top, and the first two columns at its left, so a cell reached far to the right
          still shows which segment it belongs to. */}
      <div
        role="grid"
        aria-label={props.label}
        aria-rowcount={lines.length + 1}
        aria-multiselectable
        ref={setGridEl}
        className={cx('min-w-0 overflow-x-auto', virtual && 'overflow-y-auto')}
        style={virtual ? { height: '70vh' } : undefined}
        data-testid={virtual ? 'tree-scroll' : undefined}
        onKeyDown={onKeyDown}
        onFocus={onFocus}
      >
        <div className="min-w-[68rem]">
          <div
            role="row"
            aria-rowindex={1}
            className="sticky top-0 z-20 grid gap-x-2 border-b-2 border-rule bg-surface py-1 text-left text-xs font-semibold"
            style={{ gridTemplateColumns: grid }}
          >
            {columns.map((c, i) => {
              const help = c.key in names ? names[c.key as DescribedColumn].hint : undefined;
              return (
                <div
                  role="columnheader"
                  key={c.key}
                  title={help}
                  className={cx(['flow', 'velocity', 'loss'].includes(c.key) ? 'text-right' : '', i === 1 ? STICKY_NAME : '', 'bg-surface')}
                >
                  {c.header}
                  {help ? (
                    <span id={helpIds[c.key as DescribedColumn]} hidden>
                      {help}
                    </span>
                  ) : null}
                </div>
              );
            })}
          </div>
          {virtual ? (
            <div style={{ height: virtualizer.getTotalSize(), position: 'relative' }}>
              {virtualItems.map((item) => (
                // placed by `top`, not a transform: no stacking context per row, so a cell's message (z-10) shows over the rows below
                <div key={`slot:${item.index % slots}`} style={{ position: 'absolute', top: item.start, left: 0, right: 0 }}>
                  {renderLine(lines[item.index], item.index, virtualizer.measureElement, slotted)}
                </div>
              ))}
            </div>
          ) : (
            <div data-testid="tree-rows">{lines.map((l, i) => renderLine(l, i))}</div>
          )}
        </div>
      </div>
    </div>
  );
}
