/**
 * Reads a stored or imported system document of either version as version 2: a version 1 document
 * is parsed with its own schema and upgraded (upgrade.ts) by the given rule — 'keep-elevations'
 * for issued revisions (reproduce what was analysed), 'follow-rises' for drafts (the typed rise
 * was the intent). The answer has the shape of zod's safeParse, so callers keep their handling.
 */
import type { z } from 'zod';
import { SystemDocumentSchema, type SystemDocument } from './schema';
import { SystemDocumentSchemaV1 } from './schemaV1';
import { upgradeDocumentWithReport, type RiseConflict, type RiseConflictRule } from './upgrade';

export type ReadResult = { success: true; data: SystemDocument; upgradedFrom: 1 | null; conflicts: RiseConflict[] } | { success: false; error: z.ZodError };

export function readSystemDocument(doc: unknown, options: { riseConflict: RiseConflictRule }): ReadResult {
  const version = doc !== null && typeof doc === 'object' ? (doc as { schemaVersion?: unknown }).schemaVersion : undefined;
  if (version === 1) {
    const v1 = SystemDocumentSchemaV1.safeParse(doc);
    if (!v1.success) return { success: false, error: v1.error };
    const { document, conflicts } = upgradeDocumentWithReport(v1.data, options);
    const v2 = SystemDocumentSchema.safeParse(document);
    if (!v2.success) return { success: false, error: v2.error };
    return { success: true, data: v2.data, upgradedFrom: 1, conflicts };
  }
  const parsed = SystemDocumentSchema.safeParse(doc);
  if (!parsed.success) return { success: false, error: parsed.error };
  return { success: true, data: parsed.data, upgradedFrom: null, conflicts: [] };
}
