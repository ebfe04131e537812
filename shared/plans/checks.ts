import { plateForceKn } from '../domain/plate';
import { plateRuleChecks } from '../procedures/plate-rules';
import type { ProcedureProfile } from '../procedures/profiles';
import type { PlanCheck, PlanInput } from '../schemas/plans';
import type { LocationInput } from '../schemas/projects';
import { loadingTargets, maxPlannedPressureKpa } from './stages';

/**
 * Checks a plan against its procedure profile and its test location. Warnings never block saving:
 * the engineer decides, but sees why.
 */
export function checkPlan(plan: PlanInput, profile: ProcedureProfile | undefined, location?: Pick<LocationInput, 'pitWidthM' | 'waterTableDepthM' | 'testDepthM'>): PlanCheck[] {
  const checks: PlanCheck[] = [];
  const warn = (code: string, message: string, field?: string) => checks.push({ code, severity: 'warning', message, field });
  const widthM = plan.plate.sizeMm / 1000;

  if (!profile) {
    warn('unknown_procedure', `Procedure "${plan.procedureId}" is not known; no profile rules were checked.`, 'procedureId');
  } else {
    const [min, max] = profile.plateSizeRangeMm;
    if (plan.plate.sizeMm < min || plan.plate.sizeMm > max) {
      warn('plate_size', `Plate ${plan.plate.sizeMm} mm is outside ${min}–${max} mm for ${profile.family}.`, 'plate.sizeMm');
    }
    if (profile.minPitWidthInPlates > 0) {
      const needed = profile.minPitWidthInPlates * widthM;
      if (location?.pitWidthM == null) {
        checks.push({ code: 'pit_width_unknown', severity: 'info', message: `Record the pit width: at least ${needed.toFixed(2)} m (${profile.minPitWidthInPlates} plate widths) is needed.`, field: 'pitWidthM' });
      } else if (location.pitWidthM < needed - 1e-9) {
        warn('pit_width', `Pit is ${location.pitWidthM} m wide; at least ${needed.toFixed(2)} m (${profile.minPitWidthInPlates} plate widths) is needed.`, 'pitWidthM');
      }
    }
    // The apparatus rests on the plate, so the jack — and the reaction — carry the rest.
    const maxLoadKn = Math.max(0, plateForceKn(plan.plate, maxPlannedPressureKpa(plan)) - plan.apparatusWeightKn);
    const needed = maxLoadKn * (1 + profile.reactionMargin);
    if (plan.reaction.capacityKn < needed) {
      warn(
        'reaction_capacity',
        `Reaction ${plan.reaction.capacityKn} kN is less than the largest planned load ${maxLoadKn.toFixed(1)} kN plus ${Math.round(profile.reactionMargin * 100)} % (${needed.toFixed(1)} kN).`,
        'reaction.capacityKn',
      );
    }
  }

  const loads = loadingTargets(plan.loading);
  if (loads.length === 0) warn('no_increments', 'The loading schedule yields no increments.', 'loading');
  else checks.push(...plateRuleChecks(plan, profile, Math.max(...loads)));
  if (loads.some((q, i) => i > 0 && q <= loads[i - 1])) warn('increments_order', 'Loading pressures should rise from one increment to the next.', 'loading');
  if (loads.length > 0 && plan.seatingPressureKpa >= loads[0]) {
    warn('seating_pressure', `Seating pressure ${plan.seatingPressureKpa} kPa is not below the first increment ${loads[0]} kPa.`, 'seatingPressureKpa');
  }
  if (plan.loading.mode === 'list' && plan.loading.pressuresKpa.length < 5 && plan.procedureId.startsWith('bearing')) {
    checks.push({ code: 'few_increments', severity: 'info', message: 'Fewer than five increments give a poorly defined load–settlement curve.', field: 'loading' });
  }
  if (plan.termination.maxSettlementMm > widthM * 1000 * 0.2) {
    warn('stop_limit', `Stop limit ${plan.termination.maxSettlementMm} mm exceeds 20 % of the plate width.`, 'termination.maxSettlementMm');
  }
  if (location?.waterTableDepthM != null && location.waterTableDepthM < location.testDepthM + widthM) {
    checks.push({ code: 'water_table', severity: 'info', message: 'The water table is within one plate width below the test level: test at, or correct to, the design water level.', field: 'waterTableDepthM' });
  }
  return checks;
}
