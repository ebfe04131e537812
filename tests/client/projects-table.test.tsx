import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { ProjectsTable } from '../../client/src/features/projects/components/projects-table';
import { aProject } from './support/fixtures';
import { renderWithProviders } from './support/render';

const PROJECTS = [
  aProject({ id: 1, code: 'P-2', name: 'Quarry road depot', organizationName: 'Lindqvist Freight', updatedAt: '2025-03-01T10:00:00Z' }),
  aProject({ id: 2, code: 'P-10', name: 'Riverside flats', updatedAt: '2025-05-01T10:00:00Z' }),
  aProject({ id: 3, code: 'P-1', name: 'School annex', updatedAt: '2025-04-01T10:00:00Z' }),
];

const codesInOrder = () =>
  within(screen.getByRole('table'))
    .getAllByRole('row')
    .slice(1)
    .map((row) => within(row).getAllByRole('cell')[0].textContent);

describe('projects table', () => {
  it('starts newest first and sorts by a column when its header is pressed', async () => {
    const { user } = renderWithProviders(<ProjectsTable projects={PROJECTS} />);
    expect(codesInOrder()).toEqual(['P-10', 'P-1', 'P-2']);

    await user.click(screen.getByRole('button', { name: /Code/ }));
    // Alphanumeric order puts P-2 before P-10.
    expect(codesInOrder()).toEqual(['P-1', 'P-2', 'P-10']);
    expect(screen.getByRole('columnheader', { name: /Code/ }).getAttribute('aria-sort')).toBe('ascending');
  });

  it('filters on any column and says how many rows are shown', async () => {
    const { user } = renderWithProviders(<ProjectsTable projects={PROJECTS} />);
    await user.type(screen.getByLabelText('Filter projects'), 'harrow');
    expect(codesInOrder()).toEqual(['P-10', 'P-1']);
    expect(screen.getByText('shown', { exact: false }).textContent).toBe('2 of 3 shown');
  });
});
