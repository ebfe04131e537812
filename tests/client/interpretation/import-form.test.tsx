import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { ImportForm } from '../../../client/src/features/imports/components/import-form';
import { locationsQueryOptions } from '../../../client/src/features/locations/api/get-locations';
import { useProjects } from '../../../client/src/features/projects/api/get-projects';

/** The form as the import page composes it. */
const Form = () => <ImportForm projects={useProjects()} locationsQuery={locationsQueryOptions} />;

import { json, requests, stubFetch } from '../support/fetch-stub';
import { aProject } from '../support/fixtures';
import { renderWithProviders } from '../support/render';

// An invented project with one pit.
const PROJECT = aProject({ id: 3, code: 'QB-07', name: 'Quarry Bank depot' });
const PIT = { id: 9, projectId: 3, pitId: 'TP-12' };
const CSV = '# plate_shape: square\n# plate_size_mm: 450\nstage,branch,target_kpa,t_min,pressure_kpa,g1\n0,seating,7,0,7,0\n0,seating,7,1,7,abc\n';

function stubImport(reply: Response) {
  return stubFetch({
    'GET /api/projects': json(200, { items: [PROJECT] }),
    'GET /api/projects/3/locations': json(200, { items: [PIT] }),
    'GET /api/auth/csrf': json(200, { csrfToken: 'token-9' }),
    'POST /api/imports': reply,
  });
}

async function pasteCsv(user: ReturnType<typeof renderWithProviders>['user']) {
  await screen.findByRole('option', { name: 'QB-07 Quarry Bank depot' });
  await user.selectOptions(screen.getByLabelText('Project'), '3');
  await screen.findByRole('option', { name: 'Pit TP-12' });
  await user.selectOptions(screen.getByLabelText('Test location'), '9');
  await user.click(screen.getByLabelText('Pasted text'));
  await user.selectOptions(screen.getByLabelText('Format'), 'csv');
  // userEvent.type treats braces and brackets as keys; plain CSV has none.
  await user.type(screen.getByLabelText('Record or readings'), CSV);
  await user.click(screen.getByRole('button', { name: 'Import' }));
}

describe('import page', () => {
  it('lists every problem the server found, by line and column, and says nothing was imported', async () => {
    const fetchMock = stubImport(
      json(400, {
        error: { code: 'invalid_record', message: '2 problems in the record; first: line 5, column "g1": not a number: "abc"' },
        issues: [
          { line: 5, column: 'g1', message: 'not a number: "abc"' },
          { line: 6, message: 'no readings below the header' },
        ],
        omitted: 3,
      }),
    );
    const { user } = renderWithProviders(<Form />);
    await pasteCsv(user);

    const problems = await screen.findByRole('alert');
    expect(within(problems).getByText('Nothing was imported')).toBeTruthy();
    const rows = within(problems).getAllByRole('row').slice(1);
    expect(rows.map((r) => r.textContent)).toEqual(['line 5, column g1not a number: "abc"', 'line 6no readings below the header']);
    expect(within(problems).getByText('…and 3 more problems not listed.')).toBeTruthy();

    const post = requests(fetchMock).find((r) => r.key === 'POST /api/imports');
    expect(post?.body).toEqual({ locationId: 9, format: 'csv', content: CSV });
    expect(post?.headers['x-csrf-token']).toBe('token-9');
  });

  it('links the created run to its interpretation', async () => {
    stubImport(json(201, { runId: 41, planId: 77, planName: 'Imported test TP-12', stages: 1, readings: 2 }));
    const { user } = renderWithProviders(<Form />);
    await pasteCsv(user);
    const link = await screen.findByRole('link', { name: 'Interpret it' });
    expect(link.getAttribute('href')).toBe('/runs/41/interpretation');
    expect(screen.getByText(/Imported as run 41/)).toBeTruthy();
  });

  it('asks for a location and a file before sending anything', async () => {
    const fetchMock = stubImport(json(500, {}));
    const { user } = renderWithProviders(<Form />);
    await screen.findByRole('option', { name: 'QB-07 Quarry Bank depot' });
    await user.click(screen.getByRole('button', { name: 'Import' }));
    expect(screen.getByText('Choose the test location the test belongs to.')).toBeTruthy();
    expect(screen.getByText('Choose a file.')).toBeTruthy();
    expect(requests(fetchMock).map((r) => r.key)).toEqual(['GET /api/projects']);
  });
});
