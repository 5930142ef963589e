/**
 * "Response to review comments": in the summary of a revision issued after a returned review, each
 * comment of that review with the item it names (as the designer typed it, never an internal id)
 * and the designer's reply. The data are read by the summaries service; this file only prints them.
 */
import type { Layout } from '../layout';
import { COLORS } from '../layout';
import { utc } from '../format';

export interface ReviewResponseComment {
  /** "Segment Riser to level 2", "Checked fixture Shower, apartment 201", "General" */
  item: string;
  comment: string;
  /** null when the designer did not answer it before issuing */
  reply: string | null;
}

export interface ReviewResponses {
  returnedRevisionNumber: number;
  reviewerName: string;
  decidedAt: string;
  /** the reviewer's overall comment, when there was one */
  overall: string;
  comments: ReviewResponseComment[];
}

export function reviewResponsesSection(L: Layout, responses: ReviewResponses[]) {
  if (!responses.length) return;
  L.heading('Response to review comments');
  for (const r of responses) {
    L.paragraph(`Revision ${r.returnedRevisionNumber} was returned by ${r.reviewerName} on ${utc(r.decidedAt)}. This revision answers it.`, {
      size: 9,
      after: 4,
    });
    if (r.overall) L.keyValues([['Reviewer’s overall comment', r.overall]]);
    if (!r.comments.length) continue;
    L.table(
      [
        { header: 'Item', width: 24, wrap: true },
        { header: 'Reviewer’s comment', width: 38, wrap: true },
        { header: 'Designer’s reply', width: 38, wrap: true },
      ],
      r.comments.map((c) => ({
        cells: [c.item, c.comment, c.reply ?? 'Not answered before this revision was issued'],
        style: c.reply ? undefined : { fail: true },
      })),
      { continued: 'Response to review comments' },
    );
    const open = r.comments.filter((c) => !c.reply).length;
    if (open)
      L.paragraph(`${open === 1 ? 'One comment was' : `${open} comments were`} not answered before this revision was issued.`, {
        size: 8.5,
        color: COLORS.fail,
      });
  }
}
