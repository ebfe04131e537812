import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { SignoffView } from '../../../client/src/features/signoff/api/signoff';
import { SignoffPanel } from '../../../client/src/features/signoff/components/signoff-panel';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { renderWithProviders } from '../support/render';

// Invented review of an invented run.
const IN_REVIEW: SignoffView = {
  runId: 12,
  state: 'in-review',
  revision: 1,
  interpretationVersion: 3,
  submittedBy: { id: 2, name: 'Pella Strand' },
  submittedAt: '2026-11-30T09:15:00.000Z',
  signatures: [],
  revisions: [],
};
const HASH = 'f'.repeat(64);
const SIGNED: SignoffView = {
  ...IN_REVIEW,
  state: 'signed',
  signatures: [
    {
      id: 1,
      revision: 1,
      interpretationVersion: 3,
      userId: 2,
      signerName: 'Pella Strand',
      meaning: 'approved',
      dataHash: HASH,
      signedAt: '2026-11-30T10:00:00.000Z',
    },
  ],
};

describe('sign-off panel', () => {
  it('asks for a meaning and the password before signing, and sends both', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': json(200, { csrfToken: 't-1' }), 'POST /api/runs/12/signoff/sign': json(200, SIGNED) });
    const { user } = renderWithProviders(<SignoffPanel view={IN_REVIEW} canSign />);
    expect(screen.getByRole('heading', { name: /Revision 1: Submitted for review/ })).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Sign' }));
    expect(screen.getByText('Enter your password to sign.')).toBeTruthy();
    expect(screen.getByText('Say what your signature means.')).toBeTruthy();
    expect(requests(fetchMock).some((r) => r.key.startsWith('POST'))).toBe(false);

    await user.selectOptions(screen.getByLabelText('Meaning of the signature'), 'approved');
    await user.type(screen.getByLabelText('Your password'), 'my-secret');
    await user.click(screen.getByRole('button', { name: 'Sign' }));
    await screen.findByRole('button', { name: 'Sign' });
    const sign = requests(fetchMock).find((r) => r.key === 'POST /api/runs/12/signoff/sign');
    expect(sign?.body).toEqual({ password: 'my-secret', meaning: 'approved' });
  });

  it('shows the server’s refusal of a wrong password at the password field', async () => {
    stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't-1' }),
      'POST /api/runs/12/signoff/sign': json(403, { error: { code: 'reauthentication_failed', message: 'password: does not match', field: 'password' } }),
    });
    const { user } = renderWithProviders(<SignoffPanel view={IN_REVIEW} canSign />);
    await user.selectOptions(screen.getByLabelText('Meaning of the signature'), 'reviewed');
    await user.type(screen.getByLabelText('Your password'), 'wrong');
    await user.click(screen.getByRole('button', { name: 'Sign' }));
    expect(await screen.findByText('password: does not match')).toBeTruthy();
  });

  it('lists signatures with their UTC time and hash, and offers sending and a new revision once signed', () => {
    stubFetch({});
    renderWithProviders(<SignoffPanel view={SIGNED} canSign />);
    expect(screen.getByText(HASH)).toBeTruthy();
    expect(screen.getByText('2026-11-30 10:00:00 UTC')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'E-mail the report to the client' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Reopen as revision' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Submit/ })).toBeNull();
    // A signed revision is not signed again.
    expect(screen.queryByRole('button', { name: 'Sign' })).toBeNull();
  });

  it('offers withdrawing a run in review to draft, with a reason', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': json(200, { csrfToken: 't-1' }), 'POST /api/runs/12/signoff/reopen': json(200, { ...IN_REVIEW, state: 'draft' }) });
    const { user } = renderWithProviders(<SignoffPanel view={IN_REVIEW} canSign />);
    await user.click(screen.getByRole('button', { name: 'Withdraw to draft' }));
    expect(screen.getByText('Say why the run goes back to draft.')).toBeTruthy();
    await user.type(screen.getByLabelText('Reason to withdraw from review'), 'One more look at the curve.');
    await user.click(screen.getByRole('button', { name: 'Withdraw to draft' }));
    await screen.findByRole('button', { name: 'Withdraw to draft' });
    const sent = requests(fetchMock).find((r) => r.key === 'POST /api/runs/12/signoff/reopen');
    expect(sent?.body).toEqual({ reason: 'One more look at the curve.' });
  });

  it('shows operators the state and signatures without any action', () => {
    stubFetch({});
    renderWithProviders(<SignoffPanel view={SIGNED} canSign={false} />);
    expect(screen.getByText(HASH)).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Sign' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'E-mail the report to the client' })).toBeNull();
  });
});
