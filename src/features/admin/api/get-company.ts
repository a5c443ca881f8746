import { queryOptions, useQuery } from '@tanstack/react-query';
import { companyResponseSchema, type Company } from '../../../../shared/schemas/company.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { companyKeys } from './company-keys.ts';

/** `GET /api/company`: the details printed on issued documents, with the logo's file id. */
export async function getCompany(signal?: AbortSignal): Promise<Company> {
  return (await apiGet('/api/company', companyResponseSchema, { signal })).company;
}

export const companyQueryOptions = () => queryOptions({ queryKey: companyKeys.detail(), queryFn: ({ signal }) => getCompany(signal) });

export function useCompany() {
  return useQuery(companyQueryOptions());
}
