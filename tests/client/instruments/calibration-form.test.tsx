import { screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { CalibrationForm } from '../../../client/src/features/instruments/components/calibration-form';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { renderWithProviders } from '../support/render';

function renderForm(kind: 'jack' | 'gauge' = 'jack') {
  const onSaved = vi.fn();
  return { onSaved, ...renderWithProviders(<CalibrationForm instrumentId={5} instrumentKind={kind} onSaved={onSaved} />) };
}

async function fillDates(user: ReturnType<typeof renderForm>['user']) {
  await user.clear(screen.getByLabelText('Calibrated on'));
  await user.type(screen.getByLabelText('Calibrated on'), '2025-06-02');
  await user.clear(screen.getByLabelText('Due on'));
  await user.type(screen.getByLabelText('Due on'), '2026-06-02');
}

describe('calibration form', () => {
  it('rejects a table whose values do not keep rising, naming the point, and sends nothing', async () => {
    const fetchMock = stubFetch({});
    const { user } = renderForm();
    await user.selectOptions(screen.getByLabelText('Curve'), 'table');
    await user.click(screen.getByRole('button', { name: 'Add point' }));
    const points = [
      [0, 0],
      [100, 48],
      [200, 41], // falls after rising: a jack table cannot be read both ways like this
    ];
    for (const [i, [x, y]] of points.entries()) {
      await user.type(screen.getByLabelText(`Point ${i + 1} reading`), String(x));
      await user.type(screen.getByLabelText(`Point ${i + 1} true value`), String(y));
    }
    await user.click(screen.getByRole('button', { name: 'Record calibration' }));

    expect(await screen.findByText(/Point 3, y: y must rise \(or fall\) strictly/)).toBeTruthy();
    expect(screen.getByLabelText('Point 3 true value').getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByLabelText('Point 2 true value').getAttribute('aria-invalid')).toBeNull();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('names an empty table cell as required', async () => {
    stubFetch({});
    const { user } = renderForm();
    await user.selectOptions(screen.getByLabelText('Curve'), 'table');
    await user.type(screen.getByLabelText('Point 1 reading'), '0');
    await user.type(screen.getByLabelText('Point 1 true value'), '0');
    await user.type(screen.getByLabelText('Point 2 reading'), '100');
    await user.click(screen.getByRole('button', { name: 'Record calibration' }));
    expect(await screen.findByText('Point 2, y: required')).toBeTruthy();
  });

  it('sends a straight-line rising curve with a table falling branch, and no unused fields', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/instruments/5/calibrations': (init) => json(201, { id: 90, instrumentId: 5, certificateFile: null, ...JSON.parse(String(init.body)) }),
    });
    const { user, onSaved } = renderForm();
    await fillDates(user);
    await user.clear(screen.getByLabelText('Offset c0'));
    await user.type(screen.getByLabelText('Offset c0'), '-0.8');
    await user.type(screen.getByLabelText('Slope c1'), '0.7854');
    await user.click(screen.getByLabelText(/give a falling curve too/));
    const [, falling] = screen.getAllByLabelText('Curve');
    await user.selectOptions(falling, 'table');
    await user.type(screen.getByLabelText('Point 1 reading'), '0');
    await user.type(screen.getByLabelText('Point 1 true value'), '0');
    await user.type(screen.getByLabelText('Point 2 reading'), '400');
    await user.type(screen.getByLabelText('Point 2 true value'), '300');
    await user.click(screen.getByRole('button', { name: 'Record calibration' }));

    await vi.waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(requests(fetchMock).find((r) => r.key === 'POST /api/instruments/5/calibrations')?.body).toEqual({
      calibratedOn: '2025-06-02',
      dueOn: '2026-06-02',
      notes: '',
      method: {
        inputUnit: 'bar',
        outputUnit: 'kN',
        curve: { kind: 'linear', c0: -0.8, c1: 0.7854 },
        fallingCurve: {
          kind: 'table',
          points: [
            { x: 0, y: 0 },
            { x: 400, y: 300 },
          ],
        },
      },
    });
  });

  it('asks a straight line for the span its certificate covers, and sends it', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/instruments/5/calibrations': (init) => json(201, { id: 91, instrumentId: 5, certificateFile: null, ...JSON.parse(String(init.body)) }),
    });
    const { user, onSaved } = renderForm();
    await fillDates(user);
    await user.type(screen.getByLabelText('Slope c1'), '4.92');
    await user.click(screen.getByRole('button', { name: 'Record calibration' }));
    expect(await screen.findByText(/give the span the certificate covers/)).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
    await user.type(screen.getByLabelText('Span from'), '0');
    await user.type(screen.getByLabelText('Span to'), '50');
    await user.click(screen.getByRole('button', { name: 'Record calibration' }));
    await vi.waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(requests(fetchMock).find((r) => r.key === 'POST /api/instruments/5/calibrations')?.body.method.range).toEqual([0, 50]);
  });

  it('does not offer a falling branch for a gauge', () => {
    stubFetch({});
    renderForm('gauge');
    expect(screen.queryByLabelText(/give a falling curve too/)).toBeNull();
  });
});
