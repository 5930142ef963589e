import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ReplyBody } from '../../../shared/api/reviewLoop';
import { ReviewResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { systemKeys } from '../../systems/api/keys';
import { projectKeys } from '../../projects/api/keys';
import { reviewKeys } from './keys';
import { reviewUrls } from './urls';

/** The reply form's schema is the API's own. */
export const replyInputSchema = ReplyBody;

export type ReplyVariables = { projectId: string; reviewId: string; commentId: string; body: ReplyBody };

/** The designer's answer to one comment of a returned review (replaces an earlier answer until the next issue). */
export async function replyToComment({ projectId, reviewId, commentId, body }: ReplyVariables) {
  const { review } = await api.request(reviewUrls.reply(projectId, reviewId, commentId), { method: 'PUT', body, schema: ReviewResponse });
  return review;
}

export function useReplyToComment() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: replyToComment,
    onSuccess: (_review, { projectId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: reviewKeys.all }),
        // the marker counts the answered comments
        queryClient.invalidateQueries({ queryKey: systemKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: systemKeys.details() }),
        queryClient.invalidateQueries({ queryKey: projectKeys.detail(projectId) }),
      ]),
  });
}
