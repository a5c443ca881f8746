import { queryOptions, useQuery } from '@tanstack/react-query';
import { mailboxResponseSchema, type Mailbox } from '../../../../shared/schemas/mail.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { mailKeys } from './mail-keys.ts';

/** `GET /api/admin/mailbox` (admins): what the local mail server received, newest first. */
export async function getMailbox(signal?: AbortSignal): Promise<Mailbox> {
  return apiGet('/api/admin/mailbox', mailboxResponseSchema, { signal });
}

export const mailboxQueryOptions = () => queryOptions({ queryKey: mailKeys.mailbox(), queryFn: ({ signal }) => getMailbox(signal), staleTime: 0 });

export function useMailbox() {
  return useQuery(mailboxQueryOptions());
}
