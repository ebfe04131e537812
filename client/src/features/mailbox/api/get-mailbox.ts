import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** A message the local mail catcher received (GET /api/mailbox). */
export interface MailboxMessage {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  attachments: { fileName: string; contentType: string; sizeBytes: number }[];
  sizeBytes: number;
}

export const mailboxKeys = { all: ['mailbox'] as const, list: () => [...mailboxKeys.all, 'list'] as const };

export const mailboxQueryOptions = () =>
  queryOptions({ queryKey: mailboxKeys.list(), queryFn: async ({ signal }) => (await api.get<{ items: MailboxMessage[] }>('/api/mailbox', signal)).items });

/** The mailbox, refreshed every 10 s while open so that a message just sent shows up. */
export const useMailbox = () => useQuery({ ...mailboxQueryOptions(), refetchInterval: 10_000 });
