/** The AGS4 part of the import page: the file is sent with its project, and a refusal lists each problem by line, group, heading and AGS4 rule. */
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { Ags4ImportForm } from '../../../client/src/features/imports/components/ags4-import-form';
import { useProjects } from '../../../client/src/features/projects/api/get-projects';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { aProject } from '../support/fixtures';
import { renderWithProviders } from '../support/render';

const Form = () => <Ags4ImportForm projects={useProjects()} />;
// An invented project.
const PROJECT = aProject({ id: 3, code: 'QB-07', name: 'Quarry Bank depot' });

function stubImport(reply: Response) {
  return stubFetch({
    'GET /api/projects': json(200, { items: [PROJECT] }),
    'GET /api/auth/csrf': json(200, { csrfToken: 'token-9' }),
    'POST /api/imports/ags4': reply,
  });
}

async function sendFile(user: ReturnType<typeof renderWithProviders>['user'], name = 'tests.ags') {
  await screen.findByRole('option', { name: 'QB-07 Quarry Bank depot' });
  await user.selectOptions(screen.getByLabelText('Project'), '3');
  await user.upload(screen.getByLabelText('AGS4 file'), new File(['"GROUP","PROJ"\r\n'], name, { type: 'text/plain' }));
  await user.click(screen.getByRole('button', { name: 'Import AGS4' }));
}

describe('AGS4 import', () => {
  it('lists every problem by line, group, heading and AGS4 rule, and says nothing was imported', async () => {
    const fetchMock = stubImport(
      json(400, {
        error: {
          code: 'invalid_record',
          message: '2 problems in the AGS4 file; first: line 12, PLTT, PLTT_SET1: "0.180" is not a number with exactly 2 decimal places (2DP) (AGS4 rule 8)',
        },
        issues: [
          { line: 12, group: 'PLTT', heading: 'PLTT_SET1', rule: '8', message: '"0.180" is not a number with exactly 2 decimal places (2DP)' },
          { line: 13, group: 'PLTT', heading: 'PLTG_CYC', rule: '10c', message: 'no PLTG row with LOCA_ID "TP1"' },
        ],
        omitted: 0,
        ignoredGroups: [],
      }),
    );
    const { user } = renderWithProviders(<Form />);
    await sendFile(user);
    const problems = await screen.findByRole('alert');
    expect(within(problems).getByText('Nothing was imported')).toBeTruthy();
    const rows = within(problems).getAllByRole('row').slice(1);
    expect(rows.map((r) => r.textContent)).toEqual([
      'line 12, PLTT, PLTT_SET1"0.180" is not a number with exactly 2 decimal places (2DP) (AGS4 rule 8)',
      'line 13, PLTT, PLTG_CYCno PLTG row with LOCA_ID "TP1" (AGS4 rule 10c)',
    ]);
    const post = requests(fetchMock).find((r) => r.key === 'POST /api/imports/ags4');
    expect(post?.headers['x-csrf-token']).toBe('token-9');
  });

  it('lists the tests stored, the locations added and the groups not read', async () => {
    stubImport(
      json(201, {
        tests: [{ runId: 41, planId: 77, planName: 'AGS4 TP1 A', locationId: 5, pitId: 'TP1', reference: 'A', stages: 3, readings: 9 }],
        addedLocations: ['TP1'],
        ignoredGroups: ['GEOL', 'SAMP'],
      }),
    );
    const { user } = renderWithProviders(<Form />);
    await sendFile(user);
    expect(await screen.findByText(/Imported 1 test, adding the test locations TP1/)).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Interpret it' }).getAttribute('href')).toBe('/runs/41/interpretation');
    expect(screen.getByText('Groups not read: GEOL, SAMP.')).toBeTruthy();
  });

  it('asks for a project and an .ags file before sending anything', async () => {
    const fetchMock = stubImport(json(500, {}));
    const { user } = renderWithProviders(<Form />);
    await screen.findByRole('option', { name: 'QB-07 Quarry Bank depot' });
    await user.click(screen.getByRole('button', { name: 'Import AGS4' }));
    expect(screen.getByText('Choose the project the tests belong to.')).toBeTruthy();
    expect(screen.getByText('Choose a file.')).toBeTruthy();
    expect(requests(fetchMock).some((r) => r.key === 'POST /api/imports/ags4')).toBe(false);
  });
});
