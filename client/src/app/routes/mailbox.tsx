import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { QueryResult } from '../../components/query-states';
import { mailboxQueryOptions, useMailbox } from '../../features/mailbox/api/get-mailbox';
import { MailboxList } from '../../features/mailbox/components/mailbox-list';
import { requirePermission } from '../route-guards';

export const mailboxLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    // 'users:manage' is the admin-only grant.
    await requirePermission(queryClient, request, 'users:manage');
    return queryClient.ensureQueryData(mailboxQueryOptions());
  };

/** What the local mail catcher received: reports sent to clients and run notices. */
export function MailboxRoute() {
  const mailbox = useMailbox();
  return (
    <>
      <PageHeader title="Mailbox" context="Outgoing mail caught on this server; nothing leaves it." />
      <QueryResult query={mailbox} loadingLabel="Loading the mailbox…">
        {(items) => <MailboxList messages={items} />}
      </QueryResult>
    </>
  );
}
