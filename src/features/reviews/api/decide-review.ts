import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { DecideReviewBody, REVIEW_ITEM_TYPES, ReviewComment, ReviewResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { inboxKeys } from '../../inbox/api/keys';
import { reviewKeys } from './keys';
import { reviewUrls } from './urls';

/**
 * The review form's fields: the API's body without `version` (the form sends the version it was
 * opened with), each item's id as a chosen value ('' for none). The same rules as the server,
 * plus one of the form's own: an item other than "general" names which item it is about.
 */
export const decideReviewInputSchema = z
  .object({
    decision: z.enum(['accepted', 'returned'], { message: 'Choose Accept or Return' }),
    comment: z.string().trim().max(8000, 'At most 8,000 characters'),
    items: z
      .array(
        ReviewComment.extend({ itemType: z.enum(REVIEW_ITEM_TYPES), itemId: z.string().trim().max(200) }).refine(
          (item) => item.itemType === 'general' || item.itemId !== '',
          { message: 'Choose the item this comment is about', path: ['itemId'] },
        ),
      )
      .max(200),
  })
  .refine((v) => v.decision === 'accepted' || v.comment.length > 0 || v.items.length > 0, {
    message: 'Say why it is returned: a comment here or at least one comment on an item',
    path: ['comment'],
  });
export type DecideReviewInput = z.input<typeof decideReviewInputSchema>;

export function toDecideReviewBody(input: z.output<typeof decideReviewInputSchema>, version: number): DecideReviewBody {
  return DecideReviewBody.parse({
    decision: input.decision,
    comment: input.comment,
    items: input.items.map((item) => ({
      itemType: item.itemType,
      itemId: item.itemType === 'general' || item.itemId === '' ? null : item.itemId,
      comment: item.comment,
    })),
    version,
  });
}

export type DecideReviewVariables = { projectId: string; reviewId: string; body: DecideReviewBody };

/** Records the inspector's decision; it is final for that revision. */
export async function decideReview({ projectId, reviewId, body }: DecideReviewVariables) {
  const { review } = await api.patch(reviewUrls.review(projectId, reviewId), body, ReviewResponse);
  return review;
}

export function useDecideReview() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: decideReview,
    onSuccess: () => Promise.all([queryClient.invalidateQueries({ queryKey: reviewKeys.all }), queryClient.invalidateQueries({ queryKey: inboxKeys.all })]),
  });
}
