import { useMutation, useQueryClient } from '@tanstack/react-query';
import { siteResponseSchema, type CreateSiteBody, type Site } from '../../../../shared/schemas/sites.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { jobsKeys } from './jobs-keys.ts';

/** `POST /api/sites`: a new site (client and address required; the rest may follow later). */
export async function createSite(body: CreateSiteBody): Promise<Site> {
  return (await apiRequest('POST', '/api/sites', siteResponseSchema, body)).site;
}

export function useCreateSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSite,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: jobsKeys.all }),
  });
}
