/**
 * The submission's identity and the preparer's attestation as the summary prints them: the permit
 * fields frozen in the header at issue (on every page's header and footer, and in the title block),
 * and the attestation recorded with the revision. Pure: summaryPdf.ts only draws what these return.
 */
import { ADOPTED_CODE_LABELS, type PermitFields } from '../../src/shared/api/projects';
import type { SummaryHeader } from '../../src/shared/api/summaries';
import { utc } from './format';

/** The attestation as recorded at issue (src/shared/api/systems.ts AttestationRecord, without who issued). */
export interface AttestationText {
  name: string;
  licenceNumber: string;
  statement: string;
  at: string;
}

const NOT_STATED = 'not stated';

/** The adopted code in words, with the local amendments after it where there are any. */
export function adoptedCodeText(p: PermitFields): string {
  const code = p.adoptedCode ? ADOPTED_CODE_LABELS[p.adoptedCode] : NOT_STATED;
  return p.localAmendments ? `${code}; local amendments: ${p.localAmendments}` : code;
}

/** The short form for the page header: "IPC 2018 + local amendments". */
function adoptedCodeShort(p: PermitFields): string {
  const short: Record<string, string> = { 'ipc-2018': 'IPC 2018', 'upc-2018': 'UPC 2018', nspc: 'NSPC', other: 'another code (see page 1)' };
  const code = p.adoptedCode ? short[p.adoptedCode] : `code ${NOT_STATED}`;
  return p.localAmendments ? `${code} + local amendments` : code;
}

/** "licence PE 40417, Wrenmoor" or "" when no licence is stated. */
export function licenceText(p: PermitFields): string {
  if (!p.preparerLicence) return '';
  return `licence ${p.preparerLicence}${p.licenceJurisdiction ? `, ${p.licenceJurisdiction}` : ''}`;
}

/** The title block's permit rows; present even when empty, so a reviewer sees what is missing. */
export function permitRows(header: SummaryHeader): [string, string][] {
  const p = header.permit;
  if (!p) return [['Permit or plan check', 'not recorded (issued before Headroom kept permit fields)']];
  return [
    ['Permit or plan check no.', p.permitNumber || NOT_STATED],
    ['Code adopted', adoptedCodeText(p)],
    ['Preparer’s licence', p.preparerLicence ? `${p.preparerLicence}, ${p.licenceJurisdiction || 'jurisdiction not stated'}` : NOT_STATED],
  ];
}

/** What every page's second header line and footer print about the submission. */
export function permitFrame(header: SummaryHeader): { left: string; right: string; licence: string } {
  const p = header.permit;
  if (!p) return { left: 'Permit not recorded', right: '', licence: '' };
  return {
    left: `Permit/plan check ${p.permitNumber || NOT_STATED} · ${adoptedCodeShort(p)}`,
    right: p.preparerLicence ? `Preparer ${licenceText(p)}` : 'Preparer licence not stated',
    licence: licenceText(p),
  };
}

/** The attestation's lines as printed in the preparer block. */
export function attestationLines(att: AttestationText | null | undefined): { recorded: boolean; lines: string[] } {
  if (!att) return { recorded: false, lines: ['No attestation was recorded when this revision was issued.'] };
  return {
    recorded: true,
    lines: [
      `“${att.statement}”`,
      `Confirmed at issue by ${att.name}, licence or registration no. ${att.licenceNumber}, on ${utc(att.at)}; recorded with this revision.`,
    ],
  };
}
