import { screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { ProjectForm } from '../../client/src/features/projects/components/project-form';
import { json, requests, stubFetch } from './support/fetch-stub';
import { aProject, HARROW_VALE } from './support/fixtures';
import { describedText, renderWithProviders } from './support/render';

const ORGS = [HARROW_VALE];

function renderForm() {
  const onSaved = vi.fn();
  return { onSaved, ...renderWithProviders(<ProjectForm organizations={ORGS} onSaved={onSaved} />) };
}

describe('project form', () => {
  it('shows zod field errors beside the fields and sends nothing', async () => {
    const fetchMock = stubFetch({});
    const { user } = renderForm();
    await user.click(screen.getByRole('button', { name: 'Create project' }));

    const code = screen.getByLabelText('Project code');
    expect(code.getAttribute('aria-invalid')).toBe('true');
    expect(describedText(code)).toContain('required');
    expect(describedText(screen.getByLabelText('Client organisation'))).toContain('required');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('shows the server field error next to the field it names', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      // The server names the field in its message too; beside the field that prefix is dropped.
      'POST /api/projects': json(409, { error: { code: 'conflict', message: 'code: already in use', field: 'code' } }),
    });
    const { user, onSaved } = renderForm();
    await user.type(screen.getByLabelText('Project code'), 'HV-07');
    await user.type(screen.getByLabelText('Project name'), 'North terrace retaining wall');
    await user.selectOptions(screen.getByLabelText('Client organisation'), '12');
    await user.type(screen.getByLabelText('Site'), 'Harrow Vale plot 4');
    await user.click(screen.getByRole('button', { name: 'Create project' }));

    const code = screen.getByLabelText('Project code');
    await vi.waitFor(() => expect(describedText(code)).toContain('already in use'));
    expect(describedText(code)).not.toContain('code:');
    expect(code.getAttribute('aria-invalid')).toBe('true');
    expect(screen.queryByRole('alert')).toBeNull(); // tied to the field, not a form-level banner
    expect(requests(fetchMock).find((c) => c.key === 'POST /api/projects')?.body).toEqual({
      code: 'HV-07',
      name: 'North terrace retaining wall',
      organizationId: 12,
      site: 'Harrow Vale plot 4',
      address: '',
      notes: '',
    });
    expect(onSaved).not.toHaveBeenCalled();
  });

  it('shows a server error without a field above the form', async () => {
    stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'PATCH /api/projects/3': json(500, { error: { code: 'internal', message: 'Saving failed; nothing was changed.' } }),
    });
    const project = aProject({ id: 3, code: 'HV-07', name: 'North terrace' });
    const { user } = renderWithProviders(<ProjectForm project={project} organizations={ORGS} onSaved={vi.fn()} />);
    await user.click(screen.getByRole('button', { name: 'Save changes' }));
    expect((await screen.findByRole('alert')).textContent).toContain('Saving failed; nothing was changed.');
  });
});
