import { z } from 'zod';
import { idParams } from '../../shared/schemas/common';
import { ADMINS, EDITORS } from '../auth/permissions';
import { route } from '../http/route';
import { MailMessage } from '../models/mail-message';
import { sendRunReport } from '../services/mail';

const mailboxQuery = z.object({ limit: z.coerce.number().int().min(1).max(500).default(100) });

/** Sending reports (their photos and site plan are read from `dataDir`) and the admin's view of the local mail catcher. */
export const mailboxRoutes = (dataDir: string) => [
  route({
    method: 'post',
    path: '/api/runs/:id/send',
    access: EDITORS,
    summary: 'E-mail a signed run’s PDF report and readings CSV to the client organisation’s contacts',
    status: 200,
    params: idParams,
    handler: ({ params, user }) => sendRunReport(user!, params.id, dataDir),
  }),
  route({
    method: 'get',
    path: '/api/mailbox',
    access: ADMINS,
    summary: 'Messages the local mail catcher received, newest first',
    query: mailboxQuery,
    handler: async ({ query }) => ({ items: (await MailMessage.findAll({ order: [['id', 'DESC']], limit: query.limit })).map((m) => m.toDto()) }),
  }),
];
