/**
 * The printable acceptance record: one page that says who accepted which revision of which system,
 * when, with which inputs (the input hash of the issued revision), and the reviewer's comments.
 * Made once, when the inspector accepts, and stored unchanged (the dates come from the decision,
 * not the clock, so the same decision gives the same bytes).
 */
import { PDFDocument } from 'pdf-lib';
import { embedFonts } from './fonts';
import { COLORS, Layout, PAGE_SIZES } from './layout';
import { utc } from './format';

export interface AcceptanceRecordInput {
  projectName: string;
  address: string;
  /** the permit or plan-check number, when the project has one */
  permitNumber: string | null;
  systemName: string;
  revisionNumber: number;
  issuedAt: string;
  inputHash: string;
  /** SHA-256 of the issued summary PDF the inspector reviewed, when it was made */
  summarySha256: string | null;
  preparerName: string;
  reviewerName: string;
  reviewerEmail: string;
  decidedAt: string;
  comment: string;
  /** item comments, each with the item named as the designer typed it */
  items: { item: string; comment: string }[];
  unitSystem: 'US' | 'SI';
}

export async function renderAcceptanceRecord(input: AcceptanceRecordInput): Promise<{ bytes: Uint8Array; pageCount: number }> {
  const pdf = await PDFDocument.create({ updateMetadata: false });
  const decided = new Date(input.decidedAt);
  pdf.setTitle(`Acceptance record: ${input.projectName}, ${input.systemName}, revision ${input.revisionNumber}`);
  pdf.setAuthor(input.reviewerName);
  pdf.setSubject('Acceptance of a water supply pressure check');
  pdf.setCreator('Headroom');
  pdf.setProducer('Headroom');
  pdf.setCreationDate(decided);
  pdf.setModificationDate(decided);
  const fonts = await embedFonts(pdf);
  const L = new Layout(pdf, fonts, input.unitSystem === 'US' ? PAGE_SIZES.letter : PAGE_SIZES.a4);

  L.gap(2);
  L.draw('ACCEPTED', L.left, L.y - 16, { font: 'bold', size: 18, color: COLORS.accent });
  L.gap(26);
  L.draw('Acceptance record of a water supply pressure check', L.left, L.y - 13, { font: 'bold', size: 13 });
  L.gap(24);
  L.keyValues([
    ['Project', input.projectName],
    ['Address', input.address || 'not stated'],
    ['Permit or plan-check no.', input.permitNumber || 'not recorded in Headroom'],
    ['System', input.systemName],
    ['Revision', `${input.revisionNumber}, issued ${utc(input.issuedAt)} by ${input.preparerName}`],
    ['Input hash (SHA-256)', input.inputHash || 'not recorded'],
    ...(input.summarySha256 ? ([['Summary PDF (SHA-256)', input.summarySha256]] as [string, string][]) : []),
    ['Accepted by', input.reviewerEmail ? `${input.reviewerName} <${input.reviewerEmail}>` : input.reviewerName],
    ['Date of acceptance', utc(input.decidedAt)],
  ]);
  L.heading('Reviewer’s comments', 2);
  if (!input.comment && !input.items.length) L.paragraph('No comments.', { color: COLORS.muted });
  if (input.comment) L.paragraph(input.comment, { after: 6 });
  if (input.items.length) {
    L.table(
      [
        { header: 'Item', width: 30, wrap: true },
        { header: 'Comment', width: 70, wrap: true },
      ],
      input.items.map((i) => ({ cells: [i.item, i.comment] })),
    );
  }
  L.gap(8);
  L.paragraph(
    'This record says that the reviewer named above accepted the issued summary of the revision identified by its input hash. Any later change to the design is a new revision and needs its own review. Headroom assists a qualified person; the adopted code, the authority having jurisdiction and licensed practice govern.',
    { size: 8, color: COLORS.muted },
  );
  L.frame(
    { left: `Acceptance record · ${input.projectName}`, right: `${input.systemName} · revision ${input.revisionNumber}` },
    { left: `Accepted by ${input.reviewerName}`, middle: `Inputs ${input.inputHash.slice(0, 16)}` },
  );
  const bytes = await pdf.save({ useObjectStreams: true, objectsPerTick: Number.POSITIVE_INFINITY });
  return { bytes, pageCount: L.pages.length };
}
