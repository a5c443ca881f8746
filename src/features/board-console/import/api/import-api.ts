/**
 * The import's and the photos' calls: reading a file (an upload with progress), the confirmed
 * batch (merged into the console's cached board like the live feed), saved mappings, photos.
 */
import { queryOptions, type QueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import type { BoardDetail } from '../../../../../shared/schemas/boards.ts';
import { apiErrorSchema } from '../../../../../shared/schemas/common.ts';
import {
  boardPhotoResponseSchema,
  boardPhotosResponseSchema,
  importReadResponseSchema,
  savedMappingsResponseSchema,
  type ImportBatchBody,
  type ImportReadResponse,
  type SaveMappingBody,
} from '../../../../../shared/schemas/import.ts';
import { ApiError, NetworkError, apiGet, apiRequest } from '../../../../lib/api-client.ts';
import { boardKeys } from '../../api/board-keys.ts';
import { boardChangesWireSchema } from '../../api/wire-schemas.ts';
import { mergeChanges } from '../../sync/merge.ts';

/** Sends a form with XMLHttpRequest, reporting the upload's progress (fetch cannot). */
function uploadWithProgress<T extends z.ZodType>(url: string, form: FormData, schema: T, onProgress: (fraction: number) => void): Promise<z.infer<T>> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('accept', 'application/json');
    xhr.withCredentials = true;
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onerror = () => reject(new NetworkError(new Error('The upload did not reach the server.')));
    xhr.onload = () => {
      let json: unknown;
      try {
        json = JSON.parse(xhr.responseText);
      } catch {
        json = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        const parsed = schema.safeParse(json);
        if (parsed.success) resolve(parsed.data);
        else reject(new ApiError(xhr.status, 'unknown', 'The server’s answer was not understood.'));
        return;
      }
      const error = apiErrorSchema.safeParse(json);
      if (error.success) {
        const { code, message, issues, details } = error.data.error;
        reject(new ApiError(xhr.status, code, message, issues ?? [], details));
      } else if (xhr.status === 413) reject(new ApiError(413, 'too_large', 'The file is too large.'));
      else reject(new ApiError(xhr.status, 'unknown', `The server answered ${xhr.status}.`));
    };
    xhr.send(form);
  });
}

/** Reads a readings file on the server (nothing is stored): its table and a proposed mapping. */
export function readImportFile(boardId: number, file: File, onProgress: (fraction: number) => void): Promise<ImportReadResponse> {
  const form = new FormData();
  form.append('file', file, file.name);
  return uploadWithProgress(`/api/boards/${boardId}/import/read`, form, importReadResponseSchema, onProgress);
}

const importAnswerSchema = boardChangesWireSchema.extend({ written: z.number().int() });

/**
 * Sends the confirmed import (or its undoing) and merges the answer into the cached board, as the
 * live feed would, so the grid shows the values at once with their new versions.
 */
export async function sendImportBatch(queryClient: QueryClient, boardId: number, body: ImportBatchBody): Promise<{ written: number; detail: BoardDetail | undefined }> {
  const answer = await apiRequest('POST', `/api/boards/${boardId}/import`, importAnswerSchema, body);
  const detail = queryClient.setQueryData<BoardDetail>(boardKeys.detail(boardId), (old) =>
    old ? mergeChanges(old, answer, { after: old.cursor, pending: new Set(), applyOrder: false }).detail : old,
  );
  return { written: answer.written, detail };
}

export const importMappingKeys = { all: ['import-mappings'] as const };

export const savedMappingsQueryOptions = () =>
  queryOptions({ queryKey: importMappingKeys.all, queryFn: ({ signal }) => apiGet('/api/import-mappings', savedMappingsResponseSchema, { signal }) });

export function saveImportMapping(body: SaveMappingBody) {
  return apiRequest('POST', '/api/import-mappings', savedMappingsResponseSchema, body);
}

export const photoKeys = { board: (boardId: number) => ['boards', 'photos', boardId] as const };

export const boardPhotosQueryOptions = (boardId: number) =>
  queryOptions({ queryKey: photoKeys.board(boardId), queryFn: ({ signal }) => apiGet(`/api/boards/${boardId}/photos`, boardPhotosResponseSchema, { signal }) });

export function attachPhoto(boardId: number, file: File, onProgress: (fraction: number) => void) {
  const form = new FormData();
  form.append('photo', file, file.name || 'pasted-photo');
  return uploadWithProgress(`/api/boards/${boardId}/photos`, form, boardPhotoResponseSchema, onProgress);
}
