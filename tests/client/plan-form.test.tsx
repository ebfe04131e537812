import { buildStageSequence } from '@shared/plans/stages';
import { findProfile } from '@shared/procedures/profiles';
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { PlanForm } from '../../client/src/features/plans/components/plan-form';
import { stubFetch } from './support/fetch-stub';
import { renderWithProviders } from './support/render';

// An invented pit 1.5 m wide; the water table was not found.
const LOCATION = { id: 5, pitWidthM: 1.5, waterTableDepthM: null, testDepthM: 1.2 };
const granular = findProfile('bearing-granular');

const fieldValue = (label: string) => (screen.getByLabelText(label) as HTMLInputElement).value;
const checkPanel = () => screen.getByRole('region', { name: 'Plan check' });

describe('plan form', () => {
  it('fills the defaults of the chosen procedure and shows where they come from', async () => {
    stubFetch({});
    if (!granular) throw new Error('profile bearing-granular is missing');
    const { user } = renderWithProviders(<PlanForm location={LOCATION} />);
    expect(screen.queryByLabelText('Plate size')).toBeNull(); // nothing to fill before a procedure is chosen

    await user.selectOptions(screen.getByLabelText('Procedure'), granular.id);

    const d = granular.defaults;
    expect(Number(fieldValue('Plate size'))).toBe(d.plate.sizeMm);
    expect(fieldValue('Plate shape')).toBe(d.plate.shape);
    expect(Number(fieldValue('Seating pressure'))).toBe(d.seatingPressureKpa);
    expect(fieldValue('A hold is satisfied by')).toBe(d.holdRule.kind);
    if (d.holdRule.kind !== 'rate' || d.loading.mode !== 'rule') throw new Error('expected a rate hold and a stepped loading rule');
    expect(Number(fieldValue('Settlement rate below'))).toBe(d.holdRule.maxRateMmPerMin);
    expect(Number(fieldValue('Fixed step'))).toBe(d.loading.fixedStepKpa);
    expect(Number(fieldValue('Stop at mean settlement'))).toBe(d.termination.maxSettlementMm);

    // The profile's source for the plate size is shown beside that field.
    const plateSource = granular.sources.find((s) => s.setting === 'plate.sizeMm');
    expect(screen.getAllByText(plateSource?.text ?? '—', { exact: false }).length).toBeGreaterThan(0);
  });

  it('warns live when the pit is narrower than five plate widths', async () => {
    stubFetch({});
    const { user } = renderWithProviders(<PlanForm location={LOCATION} />);
    await user.selectOptions(screen.getByLabelText('Procedure'), 'bearing-granular');
    // The check waits for settings no procedure decides.
    expect(within(checkPanel()).getByText('Reaction capacity')).toBeTruthy();

    await user.type(screen.getByLabelText('Reaction capacity'), '500');
    // Pit at least five plate widths wide (IS 1888:1982, seen in secondary texts): 5 × 0.45 m = 2.25 m > 1.5 m.
    expect(within(checkPanel()).getByText('Pit is 1.5 m wide; at least 2.25 m (5 plate widths) is needed.')).toBeTruthy();
    expect(within(checkPanel()).getByText('1 warning, 0 notes')).toBeTruthy();

    // A 300 mm plate needs 5 × 0.3 m = 1.5 m: the warning goes as soon as the size changes.
    const size = screen.getByLabelText('Plate size');
    await user.clear(size);
    await user.type(size, '300');
    expect(within(checkPanel()).queryByText(/Pit is 1.5 m wide/)).toBeNull();
  });

  it('previews the stage sequence the plan implies', async () => {
    stubFetch({});
    if (!granular) throw new Error('profile bearing-granular is missing');
    const { user } = renderWithProviders(<PlanForm location={LOCATION} />);
    await user.selectOptions(screen.getByLabelText('Procedure'), granular.id);
    await user.type(screen.getByLabelText('Reaction capacity'), '500');

    const preview = screen.getByRole('region', { name: 'Stage sequence' });
    const rows = within(preview).getAllByRole('row').slice(1); // minus the header row
    expect(rows).toHaveLength(buildStageSequence(granular.defaults).length);
    // Stepped rule: the smaller of 100 kPa and a fifth of 600 kPa is 100 kPa (common practice rule in the profile).
    expect(within(rows[1]).getByText('100')).toBeTruthy();
    expect(within(rows[0]).getByText('Seating')).toBeTruthy();
  });

  it("offers the chosen plate's maximum and stop limit, and the check warns until they are taken", async () => {
    stubFetch({});
    const { user } = renderWithProviders(<PlanForm location={LOCATION} />);
    await user.selectOptions(screen.getByLabelText('Procedure'), 'modulus-two-cycle');
    await user.type(screen.getByLabelText('Reaction capacity'), '500');
    expect(screen.queryByRole('button', { name: /plate's stages/ })).toBeNull(); // the 300 mm defaults fit the 300 mm plate

    const size = screen.getByLabelText('Plate size');
    await user.clear(size);
    await user.type(size, '600');
    // DIN 18134 family, from memory: a 600 mm plate to 0.25 MN/m², stop at 8 mm.
    expect(within(checkPanel()).getByText(/loads a 600 mm plate to 250 kPa/)).toBeTruthy();
    expect(within(checkPanel()).getByText(/stops a 600 mm plate at 8 mm/)).toBeTruthy();
    // The stop limit's source follows the plate too.
    expect(screen.getAllByText(/8 mm on the 600 mm plate/).length).toBeGreaterThan(0);
    await user.click(screen.getByRole('button', { name: "Use the 600 mm plate's stages and stop limit" }));

    expect(Number(fieldValue('Stop at mean settlement'))).toBe(8);
    expect(within(checkPanel()).queryByText(/600 mm plate/)).toBeNull();
    const rows = within(screen.getByRole('region', { name: 'Stage sequence' })).getAllByRole('row').slice(1);
    expect(rows.some((r) => within(r).queryByText('250'))).toBe(true);
    expect(rows.some((r) => within(r).queryByText('500'))).toBe(false);
  }, 30_000); // many keystrokes through the whole form: slow on a loaded machine
});
