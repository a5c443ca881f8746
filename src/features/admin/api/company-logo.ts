import { useMutation, useQueryClient } from '@tanstack/react-query';
import { companyResponseSchema, type Company } from '../../../../shared/schemas/company.ts';
import { apiRequest, apiUpload } from '../../../lib/api-client.ts';
import { companyKeys } from './company-keys.ts';

/** `POST /api/company/logo`: a PNG or JPEG of at most 1 MB; the server checks its content. */
export async function uploadLogo(file: Blob & { name?: string }): Promise<Company> {
  const form = new FormData();
  form.append('logo', file, file.name ?? 'logo');
  return (await apiUpload('POST', '/api/company/logo', companyResponseSchema, form)).company;
}

export async function removeLogo(): Promise<Company> {
  return (await apiRequest('DELETE', '/api/company/logo', companyResponseSchema)).company;
}

export function useUploadLogo() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: uploadLogo, onSuccess: (company) => queryClient.setQueryData(companyKeys.detail(), company) });
}

export function useRemoveLogo() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: removeLogo, onSuccess: (company) => queryClient.setQueryData(companyKeys.detail(), company) });
}
