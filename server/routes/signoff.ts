import { z } from 'zod';
import { idParams } from '../../shared/schemas/common';
import { SIGNATURE_MEANINGS } from '../../shared/schemas/signoff';
import { EDITORS, STAFF } from '../auth/permissions';
import type { ServerConfig } from '../config';
import { route } from '../http/route';
import type { DomainEvents } from '../services/domain-events';
import { reopenRun, signoffView, signRun, submitForReview, verifyRun } from '../services/signoff';

export const signInput = z.strictObject({
  password: z.string().min(1, 'required: your password, to confirm it is you signing').max(200),
  meaning: z.enum(SIGNATURE_MEANINGS),
});

export const reopenInput = z.strictObject({
  reason: z.string().trim().min(1, 'required: say why the run is reopened').max(500),
});

/** Review and sign-off; signing seals the report with the uploads under `dataDir`. Submitting and signing are published as events. */
export const signoffRoutes = (config: Pick<ServerConfig, 'dataDir' | 'secondSigner'>, events: DomainEvents) => [
  route({
    method: 'get',
    path: '/api/runs/:id/signoff',
    access: STAFF,
    summary: 'Review state of a run: state, revision, the version under review, every signature',
    params: idParams,
    handler: ({ params }) => signoffView(params.id),
  }),
  route({
    method: 'post',
    path: '/api/runs/:id/signoff/submit',
    access: EDITORS,
    summary: 'Submit the run’s newest interpretation version for review',
    status: 200,
    params: idParams,
    handler: async ({ params, user }) => {
      const view = await submitForReview(user!, params.id);
      events.publish('submitted-for-review', { runId: params.id, submitter: { id: user!.id, name: user!.name } });
      return view;
    },
  }),
  route({
    method: 'post',
    path: '/api/runs/:id/signoff/sign',
    access: EDITORS,
    summary: 'Sign the version under review (password asked again, someone other than the submitter); seals the report and locks the run',
    status: 200,
    params: idParams,
    body: signInput,
    handler: async ({ params, body, user }) => {
      const view = await signRun(user!, params.id, body, { dataDir: config.dataDir, secondSigner: config.secondSigner });
      events.publish('signed', { runId: params.id, revision: view.revision, signer: { id: user!.id, name: user!.name } });
      return view;
    },
  }),
  route({
    method: 'post',
    path: '/api/runs/:id/signoff/reopen',
    access: EDITORS,
    summary: 'Reopen a signed run as a new revision, or withdraw one in review to draft, with a reason',
    status: 200,
    params: idParams,
    body: reopenInput,
    handler: ({ params, body, user }) => reopenRun(user!, params.id, body.reason),
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/verify',
    access: STAFF,
    summary: 'Check every signature against its sealed report as stored, and say whether today’s data still match',
    params: idParams,
    handler: ({ params }) => verifyRun(params.id, config.dataDir),
  }),
];
