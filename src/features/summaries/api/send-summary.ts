import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { Email } from '../../../shared/api/auth';
import { SendSummaryBody, SendSummaryResponse } from '../../../shared/api/summaries';
import { api } from '../../../lib/api-client';
import { memberKeys } from '../../members/api/keys';
import { reviewKeys } from '../../reviews/api/keys';
import { summaryKeys } from './keys';
import { summaryUrls } from './urls';

/** SendSummaryBody (src/shared/api/summaries.ts) allows 20 inspectors and 20 outside addresses per send. */
const MAX_RECIPIENTS_EACH = 20;

/**
 * The send dialog's fields: the API's body, with the outside addresses as rows (one input each)
 * so that each gets its own error message. `toSendSummaryBody` turns it into the API's body.
 */
export const sendSummaryInputSchema = z
  .object({
    inspectorIds: z.array(z.string()).max(MAX_RECIPIENTS_EACH, `At most ${MAX_RECIPIENTS_EACH} inspectors at a time`),
    emails: z.array(z.object({ address: Email })).max(MAX_RECIPIENTS_EACH, `At most ${MAX_RECIPIENTS_EACH} outside addresses at a time`),
    message: z.string().trim().max(2000, 'At most 2,000 characters'),
  })
  .refine((v) => v.inspectorIds.length + v.emails.length > 0, { message: 'Choose at least one inspector or add an outside address', path: ['inspectorIds'] });
export type SendSummaryInput = z.input<typeof sendSummaryInputSchema>;

export function toSendSummaryBody(input: z.output<typeof sendSummaryInputSchema>): SendSummaryBody {
  const body = SendSummaryBody.parse({
    inspectorIds: input.inspectorIds,
    emails: [...new Set(input.emails.map((row) => row.address))],
    ...(input.message ? { message: input.message } : {}),
  });
  return body;
}

export type SendSummaryVariables = { projectId: string; systemId: string; revisionId: string; body: SendSummaryBody };

export async function sendSummary({ projectId, systemId, revisionId, body }: SendSummaryVariables) {
  return api.post(summaryUrls.send(projectId, systemId, revisionId), body, SendSummaryResponse);
}

export function useSendSummary() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendSummary,
    onSuccess: (_result, { projectId, systemId, revisionId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: summaryKeys.messages(projectId, systemId, revisionId) }),
        queryClient.invalidateQueries({ queryKey: reviewKeys.all }),
        queryClient.invalidateQueries({ queryKey: summaryKeys.audit(projectId) }),
        // an outside address becomes an inspector member of the project
        queryClient.invalidateQueries({ queryKey: memberKeys.list(projectId) }),
      ]),
  });
}
