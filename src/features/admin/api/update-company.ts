import { useMutation, useQueryClient } from '@tanstack/react-query';
import { companyResponseSchema, type Company, type CompanyFields } from '../../../../shared/schemas/company.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { companyKeys } from './company-keys.ts';

export async function updateCompany(fields: CompanyFields): Promise<Company> {
  return (await apiRequest('PUT', '/api/company', companyResponseSchema, fields)).company;
}

/** Saves the company's text details (admin); the page shows the server's answer. */
export function useUpdateCompany() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCompany,
    onSuccess: (company) => queryClient.setQueryData(companyKeys.detail(), company),
  });
}
