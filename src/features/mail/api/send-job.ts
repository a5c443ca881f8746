import { useMutation, useQueryClient } from '@tanstack/react-query';
import { outgoingMailResponseSchema, type OutgoingMail, type SendJobBody } from '../../../../shared/schemas/mail.ts';
import { apiRequest } from '../../../lib/api-client.ts';

/** `POST /api/jobs/:jobId/send`: queues the e-mail; the server answers at once and sends it in the background. */
export async function sendJob({ jobId, body }: { jobId: number; body: SendJobBody }): Promise<OutgoingMail> {
  return (await apiRequest('POST', `/api/jobs/${jobId}/send`, outgoingMailResponseSchema, body)).mail;
}

/** `POST /api/mail/:mailId/retry`: sends a failed e-mail again. */
export async function retryMail(mailId: number): Promise<OutgoingMail> {
  return (await apiRequest('POST', `/api/mail/${mailId}/retry`, outgoingMailResponseSchema)).mail;
}

export function useSendJob() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: sendJob, onSuccess: () => queryClient.invalidateQueries({ queryKey: ['jobs'] }) });
}

export function useRetryMail() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: retryMail, onSuccess: () => queryClient.invalidateQueries({ queryKey: ['jobs'] }) });
}
