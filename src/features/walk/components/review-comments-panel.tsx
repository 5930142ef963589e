import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useParams } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextAreaField } from '../../../components/ui/field';
import { Loading } from '../../../components/ui/loading';
import { errorMessage } from '../../../lib/error-messages';
import { formatDateTime } from '../../../lib/labels';
import type { SystemDocument } from '../../../engine';
import type { ReplyBody } from '../../../shared/api/reviewLoop';
import type { Review } from '../../../shared/api/summaries';
import { useRevisionReviews } from '../../reviews/api/get-revision-reviews';
import { replyInputSchema, useReplyToComment } from '../../reviews/api/reply-to-comment';
import { ITEM_TYPE_LABELS, INPUT_ITEMS } from '../../reviews/components/review-items';
import { ReturnedSystemMark } from '../../reviews/components/returned-marker';
import { useWalk } from '../draft/walk-context';
import { WALK_STEPS } from '../steps';
import type { WalkStepId } from '../steps';

type Comment = Review['items'][number];

/** The steps where an item is edited (the first is where "Go to" leads). */
const INPUT_STEPS: Record<string, WalkStepId[]> = {
  source: ['supply'],
  waterTemperature: ['supply'],
  devices: ['devices'],
  demand: ['risers'],
  elevations: ['elevation'],
  criteria: ['result'],
  codeBasis: ['result'],
};
export function stepsOfItem(c: Pick<Comment, 'itemType' | 'itemId'>): WalkStepId[] {
  switch (c.itemType) {
    case 'segment':
      return ['risers', 'fittings'];
    case 'device':
      return ['devices'];
    case 'node':
      return ['elevation', 'risers'];
    case 'fixture':
      return ['fixtures'];
    case 'input':
      return INPUT_STEPS[c.itemId ?? ''] ?? ['supply'];
    default:
      return ['result'];
  }
}

/** The item as the designer named it in this draft: "Segment Riser to level 2". */
export function itemName(doc: SystemDocument, c: Pick<Comment, 'itemType' | 'itemId'>): string {
  const type = ITEM_TYPE_LABELS[c.itemType];
  if (c.itemType === 'general' || !c.itemId) return type;
  if (c.itemType === 'input') return `${type}: ${INPUT_ITEMS.find((o) => o.value === c.itemId)?.label ?? c.itemId}`;
  const label =
    c.itemType === 'segment'
      ? doc.segments.find((s) => s.id === c.itemId)?.label
      : c.itemType === 'device'
        ? doc.devices.find((d) => d.id === c.itemId)?.label
        : c.itemType === 'node'
          ? doc.nodes.find((n) => n.id === c.itemId)?.label
          : doc.nodes.flatMap((n) => n.checkedFixtures).find((f) => f.id === c.itemId)?.label;
  return label ? `${type} ${label}` : `${type} (not in this revision any more)`;
}

function ReplyForm({ review, comment, n }: { review: Review; comment: Comment; n: number }) {
  const reply = useReplyToComment();
  const [open, setOpen] = useState(comment.reply === null);
  const form = useForm<ReplyBody>({ resolver: zodResolver(replyInputSchema), defaultValues: { reply: comment.reply?.text ?? '' } });
  const onSubmit = form.handleSubmit((body) =>
    reply.mutate({ projectId: review.projectId, reviewId: review.id, commentId: comment.id, body }, { onSuccess: () => setOpen(false) }),
  );
  if (!open) {
    return (
      <Button variant="quiet" onClick={() => setOpen(true)}>
        Change the reply to comment {n}
      </Button>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="mt-2 flex flex-col gap-2" aria-label={`Reply to comment ${n}`}>
      <TextAreaField
        label={`Your reply to comment ${n}`}
        hint="What you changed, or why nothing needs to change. It is printed with the comment in the next issued summary."
        error={form.formState.errors.reply?.message}
        {...form.register('reply')}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" pending={reply.isPending} pendingLabel="Saving the reply…">
          Mark comment {n} answered
        </Button>
        {comment.reply ? (
          <Button variant="secondary" onClick={() => setOpen(false)}>
            Keep the reply as it was
          </Button>
        ) : null}
      </div>
      {reply.isError ? (
        <Alert tone="fault" title="Reply not saved">
          {errorMessage(reply.error)}
        </Alert>
      ) : null}
    </form>
  );
}

function CommentNote({
  review,
  comment,
  n,
  doc,
  canReply,
  here,
}: {
  review: Review;
  comment: Comment;
  n: number;
  doc: SystemDocument;
  canReply: boolean;
  here: boolean;
}) {
  const { links } = useWalk();
  const steps = stepsOfItem(comment);
  const stepLabel = WALK_STEPS.find((s) => s.id === steps[0])?.label ?? steps[0];
  return (
    <li className="rounded border-l-4 border-copper bg-paper px-3 py-2" data-testid={`review-note-${comment.itemType}-${comment.itemId ?? 'general'}`}>
      <p className="text-sm font-semibold">
        Comment {n} · {itemName(doc, comment)}
      </p>
      <p className="whitespace-pre-wrap">{comment.comment}</p>
      {comment.reply ? (
        <p className="mt-1 text-sm" data-testid="review-note-reply">
          <span className="font-semibold">Answered</span>
          {comment.reply.by ? ` by ${comment.reply.by}` : ''} on {formatDateTime(comment.reply.at)}:{' '}
          <span className="whitespace-pre-wrap">{comment.reply.text}</span>
        </p>
      ) : (
        <p className="mt-1 text-sm font-semibold text-caution">Not answered yet</p>
      )}
      {!here ? (
        <p className="mt-1 text-sm">
          <Link to={links.step(steps[0])}>Go to the {stepLabel} step</Link>
        </p>
      ) : null}
      {canReply ? <ReplyForm review={review} comment={comment} n={n} /> : null}
    </li>
  );
}

/**
 * The inspector's comments on the returned revision, beside the items they name: on each step of
 * the next draft, the comments on that step's items (a segment on Risers and Fittings, a device on
 * Meter & devices, a checked fixture on Remote fixture…), the others folded below with a link to
 * their step. The designer marks each answered with a reply; the replies freeze at the next issue.
 */
export function ReviewCommentsPanel() {
  const { ids, system, revision, project, document: doc } = useWalk();
  const { step } = useParams();
  const headingId = useId();
  const marker = system.returned;
  const shown = Boolean(marker) && (revision.status === 'draft' || revision.id === marker?.revisionId);
  const reviews = useRevisionReviews(ids.projectId, ids.systemId, marker?.revisionId ?? '', shown);
  if (!marker || !shown) return null;
  if (reviews.isPending) return <Loading label="Loading the inspector’s comments…" />;
  if (reviews.isError) return <ErrorView error={reviews.error} onRetry={() => void reviews.refetch()} what="the inspector’s comments" />;
  const review = reviews.data.find((r) => r.id === marker.reviewId);
  if (!review) return null;
  const canReply = project.myRole === 'designer' && review.answeredIn === null;
  const numbered = review.items.map((c, i) => ({ c, n: i + 1 }));
  const atStep = (c: Comment) => !step || stepsOfItem(c).includes(step as WalkStepId);
  const here = numbered.filter(({ c }) => atStep(c));
  const elsewhere = numbered.filter(({ c }) => !atStep(c));
  const stepLabel = WALK_STEPS.find((s) => s.id === step)?.label;
  return (
    <section className="rounded-md border-2 border-caution bg-caution-soft p-3 print:hidden" aria-labelledby={headingId} data-testid="review-comments-panel">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id={headingId} className="text-lg">
          Inspector’s comments on revision {review.revisionNumber}
        </h2>
        <ReturnedSystemMark marker={marker} myRole={project.myRole} />
      </div>
      <p className="mt-1 max-w-prose text-sm text-ink-soft">
        Returned by {review.reviewer.name} on {review.decidedAt ? formatDateTime(review.decidedAt) : '—'}. Answer each comment here; the replies are printed
        under “Response to review comments” in the summary of the next revision you issue, and freeze then.
      </p>
      {review.comment ? (
        <p className="mt-2 whitespace-pre-wrap">
          <span className="font-semibold">Overall: </span>
          {review.comment}
        </p>
      ) : null}
      {review.items.length ? (
        <>
          <p className="mt-3 text-sm font-semibold">{step ? `At this step (${stepLabel ?? step}): ${here.length}` : `All comments: ${here.length}`}</p>
          {here.length ? (
            <ul className="mt-1 flex flex-col gap-2" aria-label="Comments at this step">
              {here.map(({ c, n }) => (
                <CommentNote key={c.id || n} review={review} comment={c} n={n} doc={doc} canReply={canReply} here />
              ))}
            </ul>
          ) : null}
          {elsewhere.length ? (
            <details className="mt-2">
              <summary className="cursor-pointer text-sm font-semibold">Comments on other steps ({elsewhere.length})</summary>
              <ul className="mt-1 flex flex-col gap-2" aria-label="Comments on other steps">
                {elsewhere.map(({ c, n }) => (
                  <CommentNote key={c.id || n} review={review} comment={c} n={n} doc={doc} canReply={canReply} here={false} />
                ))}
              </ul>
            </details>
          ) : null}
        </>
      ) : null}
    </section>
  );
}
