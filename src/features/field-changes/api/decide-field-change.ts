import { useMutation, useQueryClient } from '@tanstack/react-query';
import { AcceptFieldChangeBody, AcceptFieldChangeResponse, DeclineFieldChangeBody, FieldChangeResponse } from '../../../shared/api/fieldChanges';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { systemKeys } from '../../systems/api/keys';
import { fieldChangeKeys } from './keys';
import { fieldChangeUrls } from './urls';
import type { FieldChangeIds } from './urls';

export { AcceptFieldChangeBody, DeclineFieldChangeBody };

/** The contractor sends the field change to the project's designers (it can no longer be edited). */
export async function proposeFieldChange({ ids, version }: { ids: FieldChangeIds; version: number }) {
  return (await api.post(fieldChangeUrls.action(ids.projectId, ids.systemId, ids.fieldChangeId, 'propose'), { version }, FieldChangeResponse)).fieldChange;
}

/** The designer accepts: a new draft revision of the system is made from the field change's document. */
export async function acceptFieldChange({ ids, body }: { ids: FieldChangeIds; body: z.input<typeof AcceptFieldChangeBody> }) {
  return api.post(fieldChangeUrls.action(ids.projectId, ids.systemId, ids.fieldChangeId, 'accept'), body, AcceptFieldChangeResponse);
}

export async function declineFieldChange({ ids, body }: { ids: FieldChangeIds; body: z.input<typeof DeclineFieldChangeBody> }) {
  return (await api.post(fieldChangeUrls.action(ids.projectId, ids.systemId, ids.fieldChangeId, 'decline'), body, FieldChangeResponse)).fieldChange;
}

function useAfterDecision() {
  const queryClient = useQueryClient();
  return (fieldChangeId: string, projectId: string, systemId: string) => {
    void queryClient.invalidateQueries({ queryKey: fieldChangeKeys.detail(fieldChangeId) });
    void queryClient.invalidateQueries({ queryKey: fieldChangeKeys.lists() });
    void queryClient.invalidateQueries({ queryKey: systemKeys.detail(projectId, systemId) });
    void queryClient.invalidateQueries({ queryKey: systemKeys.list(projectId) });
  };
}

export function useProposeFieldChange() {
  const after = useAfterDecision();
  return useMutation({ mutationFn: proposeFieldChange, onSuccess: (_fc, { ids }) => after(ids.fieldChangeId, ids.projectId, ids.systemId) });
}

export function useAcceptFieldChange() {
  const after = useAfterDecision();
  return useMutation({ mutationFn: acceptFieldChange, onSuccess: (_r, { ids }) => after(ids.fieldChangeId, ids.projectId, ids.systemId) });
}

export function useDeclineFieldChange() {
  const after = useAfterDecision();
  return useMutation({ mutationFn: declineFieldChange, onSuccess: (_fc, { ids }) => after(ids.fieldChangeId, ids.projectId, ids.systemId) });
}
