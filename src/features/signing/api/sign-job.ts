import { useMutation, useQueryClient } from '@tanstack/react-query';
import { signatureResponseSchema, type Signature, type SignBody } from '../../../../shared/schemas/signatures.ts';
import { apiUpload } from '../../../lib/api-client.ts';

/** `POST /api/jobs/:jobId/signatures`: the role, the typed name and the image (drawn or chosen). */
export async function signJob({ jobId, body, image, filename }: { jobId: number; body: SignBody; image: Blob; filename: string }): Promise<Signature> {
  const form = new FormData();
  form.append('role', body.role);
  form.append('name', body.name);
  form.append('image', image, filename);
  return (await apiUpload('POST', `/api/jobs/${jobId}/signatures`, signatureResponseSchema, form)).signature;
}

/** Signing changes the job (its history, what can be issued): everything under `['jobs']` is fetched again. */
export function useSignJob() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: signJob, onSuccess: () => queryClient.invalidateQueries({ queryKey: ['jobs'] }) });
}
