/**
 * The words of Headroom's e-mails. A one-time link is written as {{secret_url}}: the outbox keeps
 * it in its own column, puts it in at sending time and erases it once the message is sent.
 */
import { SUMMARY_CAUTIONS, type SummaryHeader } from '../../src/shared/api/summaries';
import { utc } from '../pdf/format';

export const SECRET_URL = '{{secret_url}}';

export function invitationMessage(opts: { name: string; expiresAt: string; purpose: 'invitation' | 'password-reset' }) {
  if (opts.purpose === 'password-reset') {
    return {
      subject: 'Headroom: choose a new password',
      text: [
        `Hello ${opts.name},`,
        '',
        'Someone asked to reset the password of your Headroom account. Choose a new one here:',
        '',
        SECRET_URL,
        '',
        `The link works once, until ${utc(opts.expiresAt)}. If you did not ask, ignore this message.`,
      ].join('\n'),
    };
  }
  return {
    subject: 'Your Headroom account',
    text: [
      `Hello ${opts.name},`,
      '',
      'An account on Headroom has been made for you. Choose your password here:',
      '',
      SECRET_URL,
      '',
      `The link works once, until ${utc(opts.expiresAt)}.`,
    ].join('\n'),
  };
}

export function summaryMessage(opts: {
  header: SummaryHeader;
  recipientName: string;
  senderName: string;
  viewUrl: string;
  verdict: string;
  note?: string;
  invitation?: { expiresAt: string };
}) {
  const h = opts.header;
  const lines = [
    `Hello ${opts.recipientName},`,
    '',
    `${opts.senderName} sends you the issued summary of a water supply pressure check for review:`,
    '',
    `  Project:   ${h.projectName}${h.address ? `, ${h.address}` : ''}`,
    `  System:    ${h.systemName}`,
    `  Revision:  ${h.revisionNumber}, issued ${utc(h.issuedAt)} by ${h.preparerName}`,
    `  Result:    ${opts.verdict}`,
    `  Inputs:    ${h.inputHash}`,
    '',
    'The summary is attached as a PDF. Read it on Headroom, and accept it or return it with comments, here:',
    '',
    `  ${opts.viewUrl}`,
  ];
  if (opts.invitation) {
    lines.push(
      '',
      `You do not have a Headroom account yet. Choose your password first (the link works once, until ${utc(opts.invitation.expiresAt)}):`,
      '',
      `  ${SECRET_URL}`,
    );
  }
  if (opts.note) lines.push('', `Note from ${opts.senderName}:`, opts.note);
  lines.push('', '—', SUMMARY_CAUTIONS[0], SUMMARY_CAUTIONS[1]);
  return { subject: `For review: ${h.projectName}, ${h.systemName}, revision ${h.revisionNumber}`, text: lines.join('\n') };
}

interface FieldChangeMailBase {
  projectName: string;
  systemName: string;
  baseRevisionNumber: number;
  number: number;
  title: string;
  recipientName: string;
  viewUrl: string;
}

/** To each designer of the project when a contractor proposes a field change. */
export function fieldChangeProposedMessage(o: FieldChangeMailBase & { contractorName: string; description: string; changes: string[]; verdict: string }) {
  const lines = [
    `Hello ${o.recipientName},`,
    '',
    `${o.contractorName} proposes a field change on the issued design and asks you to accept or decline it:`,
    '',
    `  Project:       ${o.projectName}`,
    `  System:        ${o.systemName}, issued revision ${o.baseRevisionNumber}`,
    `  Field change:  ${o.number}, ${o.title}`,
    `  Result:        ${o.verdict}`,
    '',
    'What changes:',
    ...o.changes.map((c) => `  - ${c}`),
  ];
  if (o.description) lines.push('', `Note from ${o.contractorName}:`, o.description);
  lines.push('', 'See the margins side by side, the attached product data, and accept or decline it here:', '', `  ${o.viewUrl}`, '', '—', SUMMARY_CAUTIONS[0]);
  return { subject: `Field change proposed: ${o.projectName}, ${o.systemName}, field change ${o.number}`, text: lines.join('\n') };
}

/** To the contractor when a designer accepts or declines their field change. */
export function fieldChangeDecidedMessage(
  o: FieldChangeMailBase & { designerName: string; decision: 'accepted' | 'declined'; text: string | null; newRevisionNumber: number | null },
) {
  const lines = [
    `Hello ${o.recipientName},`,
    '',
    o.decision === 'accepted'
      ? `${o.designerName} accepted your field change ${o.number} (${o.title}) on ${o.projectName}, ${o.systemName}. It becomes revision ${o.newRevisionNumber}, a draft the designer issues; build to the issued revision.`
      : `${o.designerName} declined your field change ${o.number} (${o.title}) on ${o.projectName}, ${o.systemName}. Build to issued revision ${o.baseRevisionNumber}.`,
  ];
  if (o.text) lines.push('', o.decision === 'declined' ? 'Reason:' : `Note from ${o.designerName}:`, o.text);
  lines.push('', `  ${o.viewUrl}`);
  return { subject: `Field change ${o.decision}: ${o.projectName}, ${o.systemName}, field change ${o.number}`, text: lines.join('\n') };
}

/** To the designer who sent the summary, when the inspector accepts it or returns it with comments. */
export function reviewDecidedMessage(o: {
  recipientName: string;
  inspectorName: string;
  projectName: string;
  systemName: string;
  revisionNumber: number;
  decision: 'accepted' | 'returned';
  comment: string;
  items: { where: string; comment: string }[];
  viewUrl: string;
}) {
  const lines = [
    `Hello ${o.recipientName},`,
    '',
    o.decision === 'accepted'
      ? `${o.inspectorName} accepted revision ${o.revisionNumber} of ${o.systemName} on ${o.projectName}.`
      : `${o.inspectorName} returned revision ${o.revisionNumber} of ${o.systemName} on ${o.projectName} with comments. Answer them in a new revision and send it again.`,
  ];
  if (o.comment) lines.push('', `Comment from ${o.inspectorName}:`, o.comment);
  if (o.items.length > 0) {
    lines.push('', o.items.length === 1 ? 'Comment on one item:' : `Comments on ${o.items.length} items:`);
    for (const it of o.items) lines.push(`  - ${it.where}: ${it.comment}`);
  }
  lines.push('', 'See the review beside the calculation here:', '', `  ${o.viewUrl}`);
  return {
    subject: `${o.decision === 'accepted' ? 'Accepted' : 'Returned with comments'}: ${o.projectName}, ${o.systemName}, revision ${o.revisionNumber}`,
    text: lines.join('\n'),
  };
}
