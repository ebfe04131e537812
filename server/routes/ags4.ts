import type { Response } from 'express';
import { formatAgs4Problem } from '../../shared/ags4/check';
import { AGS4_MAX_BYTES, ags4ExportQuery, ags4ImportInput } from '../../shared/schemas/ags4';
import { idParams } from '../../shared/schemas/common';
import { EDITORS, STAFF } from '../auth/permissions';
import { loadLocation, loadProject } from '../auth/scope';
import { badRequest } from '../http/errors';
import { route } from '../http/route';
import { singleUpload } from '../http/uploads';
import { Ags4Refused, type Ags4Scope, ags4Export, ags4Import, locationScope, projectTestsScope, runScope } from '../services/ags4';

/** Sends the checked file (the notes of its stated choices are in its TRAN_REM). */
async function sendAgs4(res: Response, scope: Ags4Scope, query: Parameters<typeof ags4Export>[1]): Promise<void> {
  const file = await ags4Export(scope, query);
  // attachment() would set the type from the .ags extension (unknown): set it after.
  res.attachment(file.fileName).type('text/plain').send(file.text);
}

export const ags4Routes = [
  route({
    method: 'get',
    path: '/api/runs/:id/ags4',
    access: STAFF,
    summary: 'A run’s test as an AGS4 file (PLTG/PLTT, edition 4.1.1), checked before it is sent',
    params: idParams,
    query: ags4ExportQuery,
    handler: async ({ params, query, res }) => sendAgs4(res, await runScope(params.id), query),
  }),
  route({
    method: 'get',
    path: '/api/locations/:id/ags4',
    access: STAFF,
    summary: 'Every test of a location as one AGS4 file, checked before it is sent',
    params: idParams,
    query: ags4ExportQuery,
    handler: async ({ params, query, user, res }) => {
      await sendAgs4(res, await locationScope(await loadLocation(user!, params.id)), query);
    },
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/ags4',
    access: STAFF,
    summary: 'Every test of a project as one AGS4 file, checked before it is sent',
    params: idParams,
    query: ags4ExportQuery,
    handler: async ({ params, query, user, res }) => {
      await sendAgs4(res, await projectTestsScope(await loadProject(user!, params.id)), query);
    },
  }),
  route({
    method: 'post',
    path: '/api/imports/ags4',
    access: EDITORS,
    summary: 'Import the plate loading tests (PLTG/PLTT) of an AGS4 file into a project, all or none',
    before: [singleUpload('file', AGS4_MAX_BYTES)],
    body: ags4ImportInput,
    handler: async ({ body, user, req, res }) => {
      const text = req.file ? req.file.buffer.toString('utf8') : body.content;
      if (text === undefined) throw badRequest('content: required (or upload a file in the field "file")', 'content');
      let project: Awaited<ReturnType<typeof loadProject>>;
      try {
        project = await loadProject(user!, body.projectId);
      } catch {
        throw badRequest('projectId: no such project', 'projectId');
      }
      try {
        return await ags4Import(user!, project, text, req.file ? req.file.originalname.slice(0, 200) : null);
      } catch (error) {
        if (!(error instanceof Ags4Refused)) throw error;
        const { problems, omitted, ignoredGroups } = error.outcome;
        const count = problems.length + omitted;
        res.status(400).json({
          error: {
            code: 'invalid_record',
            message: `${count === 1 ? 'One problem' : `${count} problems`} in the AGS4 file; first: ${formatAgs4Problem(problems[0])}`,
          },
          issues: problems,
          omitted,
          ignoredGroups,
        });
      }
    },
  }),
];
