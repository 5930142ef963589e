import { readFileSync } from 'node:fs';
import { analyzeSystem, SystemDocumentSchema } from '../../../src/engine';
import { summaryGoldenText } from '../../../server/pdf/summaryGolden';
import { ATTESTATION_STATEMENTS } from '../../../src/shared/api/systems';
import type { SummaryHeader } from '../../../src/shared/api/summaries';

/** The invented header and attestation of every golden summary (the "Alder & Finch" scenario). */
export const GOLDEN_HEADER: SummaryHeader = {
  projectName: 'Alder & Finch',
  address: '410 Quarry Lane, Wrenmoor',
  codeBasis: 'Wrenmoor plumbing code (invented)',
  systemName: 'Golden',
  revisionNumber: 1,
  issuedAt: '2026-12-01T12:00:00.000Z',
  preparerName: 'Dana Whitlow',
  preparerEmail: '',
  inputHash: '0'.repeat(64),
  note: null,
  permit: { permitNumber: 'WRN-PC-2026-0418', adoptedCode: 'ipc-2018', localAmendments: 'Town of Wrenmoor amendments (invented)', preparerLicence: 'PE 40417', licenceJurisdiction: 'Wrenmoor (invented)' },
};
export const GOLDEN_ATTESTATION = { name: 'Dana Whitlow', licenceNumber: 'PE 40417', statement: ATTESTATION_STATEMENTS.prepared, at: '2026-12-01T11:58:00.000Z' };
/** A failing example is summarised with an acknowledgement, as the server requires at issue. */
const GOLDEN_ACK = { statement: 'Issued for the golden file; the failing fixture is being resized.', by: 'Dana Whitlow', at: '2026-12-01T11:58:00.000Z' };

export function goldenSummaryText(file: string): string {
  const document = SystemDocumentSchema.parse(JSON.parse(readFileSync(file, 'utf8')));
  const analysis = analyzeSystem(document);
  return summaryGoldenText({ header: { ...GOLDEN_HEADER, systemName: document.name }, document, analysis, attestation: GOLDEN_ATTESTATION, failureAcknowledgement: GOLDEN_ACK });
}
