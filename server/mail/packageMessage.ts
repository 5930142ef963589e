/** The e-mail of one submission for a building: every system of the package, its verdict and its link; one PDF per system attached. */
import { SUMMARY_CAUTIONS, type SummaryHeader } from '../../src/shared/api/summaries';
import { utc } from '../pdf/format';

export function packageMessage(opts: {
  recipientName: string;
  senderName: string;
  projectName: string;
  address: string;
  systems: { header: SummaryHeader; verdict: string; viewUrl: string }[];
  note?: string;
}) {
  const n = opts.systems.length;
  const lines = [
    `Hello ${opts.recipientName},`,
    '',
    `${opts.senderName} sends you the issued summaries of ${n === 1 ? 'one system' : `${n} systems`} of one building for review, as one submission:`,
    '',
    `  Project:   ${opts.projectName}${opts.address ? `, ${opts.address}` : ''}`,
  ];
  opts.systems.forEach((s, i) => {
    const h = s.header;
    lines.push(
      '',
      `${i + 1}. ${h.systemName}, revision ${h.revisionNumber}, issued ${utc(h.issuedAt)} by ${h.preparerName}`,
      `   Result:  ${s.verdict}`,
      `   Inputs:  ${h.inputHash}`,
      `   Review:  ${s.viewUrl}`,
    );
  });
  lines.push(
    '',
    `Each system's summary is attached as its own PDF. Accept or return each system on Headroom at its link above; comments stay with their system.`,
  );
  if (opts.note) lines.push('', `Note from ${opts.senderName}:`, opts.note);
  lines.push('', '—', SUMMARY_CAUTIONS[0], SUMMARY_CAUTIONS[1]);
  return {
    subject: `For review: ${opts.projectName}, ${n === 1 ? opts.systems[0].header.systemName : `${n} systems`} (one submission)`,
    text: lines.join('\n'),
  };
}
