import { z } from 'zod';

/** One photo of the paper notes as the job screen and the review screen show it. */
export const jobPhotoSchema = z.object({
  /** The stored file's id (its bytes: GET /api/files/:id). */
  id: z.number().int(),
  mime: z.string(),
  originalName: z.string().nullable(),
  uploadedBy: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  uploadedAt: z.string(),
  /** True when the photo is chosen to go with the document to the client; false unless someone chose it. */
  sendToClient: z.boolean(),
});
export type JobPhoto = z.infer<typeof jobPhotoSchema>;

/** `GET /api/jobs/:jobId/photos`: the job's photos by board, boards in their order, photos oldest first. */
export const jobPhotosResponseSchema = z.object({
  boards: z.array(
    z.object({
      boardId: z.number().int(),
      reference: z.string(),
      photos: z.array(jobPhotoSchema),
    }),
  ),
});
export type JobPhotos = z.infer<typeof jobPhotosResponseSchema>;

/** `PUT /api/photos/:fileId/send-choice`: whether the photo goes with the document to the client. */
export const photoSendChoiceBodySchema = z.object({
  sendToClient: z.boolean({ error: 'Say whether the photo goes with the document: true or false.' }),
});
export type PhotoSendChoiceBody = z.infer<typeof photoSendChoiceBodySchema>;

export const jobPhotoResponseSchema = z.object({ photo: jobPhotoSchema });
