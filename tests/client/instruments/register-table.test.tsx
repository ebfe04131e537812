import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { InstrumentsTable } from '../../../client/src/features/instruments/components/instruments-table';
import { renderWithProviders } from '../support/render';
import { anInstrument, REGISTER } from './fixtures';

function rowOf(serial: string): HTMLElement {
  const row = screen.getByRole('link', { name: serial }).closest('tr');
  if (!row) throw new Error(`no row for ${serial}`);
  return row;
}

describe('instrument register table', () => {
  it('states each calibration status in words, not by colour alone', () => {
    renderWithProviders(<InstrumentsTable instruments={REGISTER} />);
    expect(within(rowOf('BR-1101')).getByText('In calibration')).toBeTruthy();
    expect(within(rowOf('BR-0877')).getByText('Overdue')).toBeTruthy();
    expect(within(rowOf('BR-1205')).getByText('Due soon')).toBeTruthy();
    expect(within(rowOf('PX-300')).getByText('Not calibrated')).toBeTruthy();
  });

  it('puts overdue instruments first and makes their due date stand out', () => {
    renderWithProviders(<InstrumentsTable instruments={REGISTER} />);
    const firstRow = screen.getAllByRole('row')[1];
    expect(within(firstRow).getByRole('link').textContent).toBe('BR-0877');
    expect(within(rowOf('BR-0877')).getByText('2025-01-10').tagName).toBe('STRONG');
    expect(within(rowOf('BR-1101')).getByText('2026-03-01').tagName).not.toBe('STRONG');
  });

  it('filters by status word and shows kind, range, resolution and travel', async () => {
    const { user } = renderWithProviders(<InstrumentsTable instruments={REGISTER} />);
    const transducer = rowOf('PX-300');
    expect(within(transducer).getByText('Pressure transducer')).toBeTruthy();
    expect(within(transducer).getByText('0 – 700 bar')).toBeTruthy();
    expect(within(transducer).getByText('0.1 bar')).toBeTruthy();
    expect(within(rowOf('BR-1101')).getByText('50 mm')).toBeTruthy();

    await user.type(screen.getByLabelText('Filter instruments'), 'overdue');
    expect(screen.getAllByRole('row')).toHaveLength(2); // header + the overdue gauge
    expect(screen.getByRole('link', { name: 'BR-0877' })).toBeTruthy();
  });

  it('shows a 0–25 mm gauge with 0.001 mm resolution and 25 mm travel exactly so, and a jack by its rated pressure', () => {
    const fine = anInstrument({ id: 9, serialNumber: 'BR-0025', status: 'in-calibration', rangeMin: 0, rangeMax: 25, resolution: 0.001, travelMm: 25 });
    renderWithProviders(<InstrumentsTable instruments={[...REGISTER, fine]} />);
    const row = rowOf('BR-0025');
    expect(within(row).getByText('0 – 25 mm')).toBeTruthy();
    expect(within(row).getByText('0.001 mm')).toBeTruthy();
    expect(within(row).getByText('25 mm')).toBeTruthy();
    expect(within(rowOf('JK-50')).getByText('70 MPa')).toBeTruthy();
  });
});
