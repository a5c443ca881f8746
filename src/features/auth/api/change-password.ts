import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import type { ChangePasswordBody } from '../../../../shared/schemas/auth.ts';
import { apiRequest } from '../../../lib/api-client.ts';

/** `POST /api/auth/password`: a new password for the signed-in person; their other sessions end. */
export async function changePassword(body: ChangePasswordBody): Promise<void> {
  await apiRequest('POST', '/api/auth/password', z.undefined(), body);
}

export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
