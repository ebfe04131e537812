import { DEFAULT_DEVICE_PROFILES } from '@shared/devices/default-profiles';
import { screen, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { RigForm } from '../../../client/src/features/rigs/components/rig-form';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { describedText, renderWithProviders } from '../support/render';
import { GAUGE_OVERDUE, GAUGE_SOON, JACK_OK, REGISTER, TRANSDUCER_NEW } from './fixtures';

function renderForm() {
  const onSaved = vi.fn();
  return { onSaved, ...renderWithProviders(<RigForm instruments={REGISTER} profiles={DEFAULT_DEVICE_PROFILES} onSaved={onSaved} />) };
}

const channel = (n: number) => screen.getByRole('group', { name: new RegExp(`^Channel ${n}`) });

describe('rig form', () => {
  it('flags an overdue gauge in the picker and once it is chosen', async () => {
    stubFetch({});
    const { user } = renderForm();
    const picker = within(channel(1)).getByLabelText('Instrument');
    expect(within(picker).getByRole('option', { name: /BR-0877.*⚠ Overdue/ })).toBeTruthy();
    expect(within(picker).queryByRole('option', { name: /PX-300/ })).toBeNull(); // a transducer is no gauge
    expect(screen.queryByRole('note')).toBeNull();

    await user.selectOptions(picker, String(GAUGE_OVERDUE.id));
    expect(within(channel(1)).getByRole('note').textContent).toContain('BR-0877 is overdue for calibration (was due 2025-01-10)');
  });

  it('flags an uncalibrated transducer on a pressure channel and offers only jacks as the jack', async () => {
    stubFetch({});
    const { user } = renderForm();
    const jackPicker = screen.getByLabelText('Jack');
    expect(
      within(jackPicker)
        .getAllByRole('option')
        .map((o) => o.textContent),
    ).toEqual(['None', 'JK-50 · Orrin 500 kN ram']);

    await user.click(screen.getByRole('button', { name: 'Add pressure channel' }));
    await user.selectOptions(within(channel(2)).getByLabelText('Instrument'), String(TRANSDUCER_NEW.id));
    expect(within(channel(2)).getByRole('note').textContent).toContain('PX-300 has no calibration on record');
  });

  it('sends a serial rig with its gauge set-up and shows schema errors by the channel', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/rigs': (init) => json(201, { id: 9, ...JSON.parse(String(init.body)) }),
    });
    const { user, onSaved } = renderForm();
    await user.type(screen.getByLabelText('Rig name'), 'Quarry Lane rig');
    await user.click(screen.getByRole('button', { name: 'Create rig' }));
    expect(describedText(within(channel(1)).getByLabelText('Serial port'))).toContain('required for a serial rig');
    expect(fetchMock).not.toHaveBeenCalled();

    const first = within(channel(1));
    await user.type(first.getByLabelText('Label'), 'North gauge');
    await user.selectOptions(first.getByLabelText('Device profile'), 'ascii-polled-mm');
    await user.type(first.getByLabelText('Serial port'), '/dev/ttyUSB0');
    await user.selectOptions(first.getByLabelText('Instrument'), String(GAUGE_SOON.id)); // brings its 30 mm travel
    expect(first.queryByRole('note')).toBeNull(); // due soon is not yet a lapse
    await user.type(first.getByLabelText('Position x'), '225');
    await user.selectOptions(first.getByLabelText('Direction'), '-1');
    await user.selectOptions(screen.getByLabelText('Jack'), String(JACK_OK.id));
    await user.click(screen.getByRole('button', { name: 'Create rig' }));

    await vi.waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(requests(fetchMock).find((r) => r.key === 'POST /api/rigs')?.body).toEqual({
      name: 'Quarry Lane rig',
      mode: 'serial',
      jackInstrumentId: JACK_OK.id,
      notes: '',
      simulator: null,
      channels: [
        {
          key: 'g1',
          role: 'gauge',
          label: 'North gauge',
          instrumentId: GAUGE_SOON.id,
          profileId: 'ascii-polled-mm',
          port: '/dev/ttyUSB0',
          gauge: { xMm: 225, yMm: 0, direction: -1, travelMm: 30 },
        },
      ],
    });
  });
});
