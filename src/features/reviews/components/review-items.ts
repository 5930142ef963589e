import { z } from 'zod';
import type { Option } from '../../../components/ui/field';
import { REVIEW_ITEM_TYPES } from '../../../shared/api/summaries';

export type ReviewItemType = (typeof REVIEW_ITEM_TYPES)[number];

export const ITEM_TYPE_LABELS: Record<ReviewItemType, string> = {
  segment: 'Segment',
  fixture: 'Checked fixture',
  device: 'Device',
  node: 'Node',
  input: 'Input',
  general: 'General',
};

export const ITEM_TYPE_OPTIONS: readonly Option[] = REVIEW_ITEM_TYPES.map((value) => ({ value, label: ITEM_TYPE_LABELS[value] }));

/** The named inputs of a system document an inspector may comment on (the walk's steps and the criteria). */
export const INPUT_ITEMS: readonly Option[] = [
  { value: 'source', label: 'Supply (source and its pressure figures)' },
  { value: 'waterTemperature', label: 'Water temperature' },
  { value: 'devices', label: 'Meter and devices' },
  { value: 'criteria', label: 'Criteria (minimum pressures, velocity limits, maximum static)' },
  { value: 'demand', label: 'Demand (fixture groups and fixture units)' },
  { value: 'elevations', label: 'Node elevations' },
  { value: 'codeBasis', label: 'Code basis' },
];

/**
 * Only the ids and labels of a revision's document are needed here; reading them leniently
 * keeps the review form usable even for a document of an older schema.
 */
const Labelled = z.object({ id: z.string(), label: z.string().optional() });
const DocumentItems = z.object({
  segments: z.array(Labelled).catch([]),
  devices: z.array(Labelled).catch([]),
  nodes: z.array(Labelled.extend({ checkedFixtures: z.array(Labelled).catch([]) })).catch([]),
});

export type ItemCatalog = Record<Exclude<ReviewItemType, 'general'>, readonly Option[]>;

const option = (item: { id: string; label?: string }): Option => ({ value: item.id, label: item.label ? `${item.label} (${item.id})` : item.id });

export function itemCatalogOf(document: unknown): ItemCatalog {
  const parsed = DocumentItems.safeParse(document);
  const doc = parsed.success ? parsed.data : { segments: [], devices: [], nodes: [] };
  return {
    segment: doc.segments.map(option),
    fixture: doc.nodes.flatMap((n) => n.checkedFixtures.map(option)),
    device: doc.devices.map(option),
    node: doc.nodes.map(option),
    input: INPUT_ITEMS,
  };
}

/** "Checked fixture: Shower, apartment 704 (shower-704)"; the id alone when the document is not at hand. */
export function describeItem(itemType: ReviewItemType, itemId: string | null, catalog?: ItemCatalog): string {
  const type = ITEM_TYPE_LABELS[itemType];
  if (itemType === 'general' || !itemId) return type;
  const known = catalog?.[itemType].find((o) => o.value === itemId);
  return `${type}: ${known?.label ?? itemId}`;
}
