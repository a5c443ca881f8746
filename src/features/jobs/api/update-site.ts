import { useMutation, useQueryClient } from '@tanstack/react-query';
import { siteResponseSchema, type Site, type UpdateSiteBody } from '../../../../shared/schemas/sites.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { jobsKeys } from './jobs-keys.ts';

/**
 * `PATCH /api/sites/:siteId`: the fields that changed, with the site's version as last seen. A 409
 * means someone else changed one of those fields since; the form shows it and reloads the site.
 */
export async function updateSite({ siteId, body }: { siteId: number; body: UpdateSiteBody }): Promise<Site> {
  return (await apiRequest('PATCH', `/api/sites/${siteId}`, siteResponseSchema, body)).site;
}

export function useUpdateSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateSite,
    onSettled: () => queryClient.invalidateQueries({ queryKey: jobsKeys.all }),
  });
}
