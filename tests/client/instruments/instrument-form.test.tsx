import { screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { InstrumentForm } from '../../../client/src/features/instruments/components/instrument-form';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { describedText, renderWithProviders } from '../support/render';
import { JACK_OK } from './fixtures';

describe('instrument form', () => {
  it('registers a gauge with its travel, empty boxes sent as null', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/instruments': (init) => json(201, { id: 31, status: 'uncalibrated', current: null, ...JSON.parse(String(init.body)) }),
    });
    const onSaved = vi.fn();
    const { user } = renderWithProviders(<InstrumentForm onSaved={onSaved} />);
    expect(screen.queryByLabelText('Stem travel')).toBeNull(); // only once the kind is a gauge
    await user.selectOptions(screen.getByLabelText('Kind'), 'gauge');
    await user.type(screen.getByLabelText('Make and model'), 'Brindle DX-25 indicator');
    await user.type(screen.getByLabelText('Serial number'), 'BR-2210');
    await user.type(screen.getByLabelText('Unit'), 'mm');
    await user.type(screen.getByLabelText('Range to'), '25');
    await user.type(screen.getByLabelText('Stem travel'), '25');
    await user.click(screen.getByRole('button', { name: 'Register instrument' }));

    await vi.waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(requests(fetchMock).find((r) => r.key === 'POST /api/instruments')?.body).toEqual({
      kind: 'gauge',
      makeModel: 'Brindle DX-25 indicator',
      serialNumber: 'BR-2210',
      unit: 'mm',
      rangeMin: null,
      rangeMax: 25,
      resolution: null,
      travelMm: 25,
      ratedPressureMpa: null,
      notes: '',
    });
  });

  it('asks a jack for its rated pressure and sends it', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/instruments': (init) => json(201, { id: 32, status: 'uncalibrated', current: null, ...JSON.parse(String(init.body)) }),
    });
    const onSaved = vi.fn();
    const { user } = renderWithProviders(<InstrumentForm onSaved={onSaved} />);
    await user.selectOptions(screen.getByLabelText('Kind'), 'jack');
    await user.type(screen.getByLabelText('Make and model'), 'Orrin 300 kN ram');
    await user.type(screen.getByLabelText('Serial number'), 'OR-300');
    await user.type(screen.getByLabelText('Unit'), 'kN');
    await user.click(screen.getByRole('button', { name: 'Register instrument' }));
    expect(describedText(await screen.findByLabelText('Rated pressure'))).toContain('rated pressure');
    expect(fetchMock).not.toHaveBeenCalled();
    await user.type(screen.getByLabelText('Rated pressure'), '70');
    await user.click(screen.getByRole('button', { name: 'Register instrument' }));
    await vi.waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(requests(fetchMock).find((r) => r.key === 'POST /api/instruments')?.body).toMatchObject({ kind: 'jack', ratedPressureMpa: 70 });
  });

  it('checks the range with the shared schema before saving a change', async () => {
    const fetchMock = stubFetch({});
    const { user } = renderWithProviders(<InstrumentForm instrument={JACK_OK} onSaved={vi.fn()} />);
    await user.type(screen.getByLabelText('Range from'), '600');
    await user.click(screen.getByRole('button', { name: 'Save changes' }));
    expect(describedText(await screen.findByLabelText('Range to'))).toContain('must be above rangeMin');
    expect(fetchMock).not.toHaveBeenCalled();
  });
});
