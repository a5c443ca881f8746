import { useMutation, useQueryClient } from '@tanstack/react-query';
import { jobPhotoResponseSchema, type JobPhoto } from '../../../../shared/schemas/job-photos.ts';
import { apiRequest } from '../../../lib/api-client.ts';

/** `PUT /api/photos/:fileId/send-choice` (reviewer or admin): whether the photo goes with the document. */
export async function setPhotoSendChoice({ photoId, sendToClient }: { photoId: number; sendToClient: boolean }): Promise<JobPhoto> {
  return (await apiRequest('PUT', `/api/photos/${photoId}/send-choice`, jobPhotoResponseSchema, { sendToClient })).photo;
}

export function useSetPhotoSendChoice() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: setPhotoSendChoice, onSuccess: () => queryClient.invalidateQueries({ queryKey: ['jobs'] }) });
}
