/** Query keys of the company's details (one record for the whole installation of Boardwalk). */
export const companyKeys = {
  all: ['company'] as const,
  detail: () => [...companyKeys.all, 'detail'] as const,
};
