/**
 * The interpretation section of the PDF report, for analyses of the current shape (analysisVersion 2): the
 * same statements the page and `npm run analyze` print, from the same analysis. Analyses saved before that
 * shape keep the section they were signed with (report-pdf.ts).
 */
import type { Finding, LabelledModulus, RecordAnalysis } from '../../shared/interpretation/analyze-record';
import { STANDING_LEGEND, STANDING_WORDS } from '../../shared/interpretation/ultimate-standing';
import { ULTIMATE_METHOD_NAMES } from '../../shared/schemas/interpretation';
import type { UltimateMethod } from '../../shared/interpretation/ultimate';
import type { ReportData } from './report-data';

/** The parts of the report writer a section uses. */
export interface SectionWriter {
  heading(text: string): void;
  field(label: string, value: string, mono?: boolean): void;
  para(text: string, size?: number): void;
  table(header: string[], rows: string[][], fractions: number[]): void;
}

const fmt = (x: number | null | undefined, digits = 1) => (x === null || x === undefined || !Number.isFinite(x) ? '–' : x.toFixed(digits));

/** True for an analysis of the current shape; saved analyses of the first shape have no version. */
export function isCurrentAnalysis(a: RecordAnalysis): boolean {
  return (a as { analysisVersion?: number }).analysisVersion === 2;
}

function finding<T>(w: SectionWriter, label: string, f: Finding<T>, show: (r: T) => string): void {
  w.field(label, f.applies ? show(f.result) : f.reason.startsWith('not shown') ? f.reason : `not determined: ${f.reason}`);
}

function ultimate(w: SectionWriter, a: RecordAnalysis): void {
  if (!a.ultimate.applies) {
    w.field('Ultimate pressure', a.ultimate.reason);
    return;
  }
  w.table(
    ['Method', 'q_ult, kPa', 'q_ult/q_max', 's/s_max', 'Standing', 'Formula, source and note'],
    a.ultimate.result.map((u) => [
      u.label,
      fmt(u.qUltKpa, 0),
      fmt(u.qOverQmax, 2),
      fmt(u.sOverSmax, 2),
      STANDING_WORDS[u.standing],
      `${u.formula}. ${u.source}${u.reason ? ` (${u.reason})` : ''}`,
    ]),
    [0.18, 0.09, 0.09, 0.08, 0.1, 0.46],
  );
  w.para(STANDING_LEGEND, 8);
  finding(w, 'Ultimate pressure carried forward', a.chosenUltimate, (c) => c.statement);
  if (a.undrainedStrength.applies) w.field('Undrained shear strength', `${a.undrainedStrength.result.statement} (${a.undrainedStrength.result.formula}; ${a.undrainedStrength.result.source})`);
}

function footing(w: SectionWriter, a: RecordAnalysis): void {
  if (!a.footing.applies) {
    w.field('Footing', a.footing.reason);
    return;
  }
  const f = a.footing.result;
  w.field('Footing', `${f.footing.shape}, ${fmt(f.footing.widthM, 2)} m wide, ${f.footing.soilBehaviour} soil, from the ${f.plateLabel}`);
  finding(w, 'Ultimate pressure of the footing', f.ultimate, (u) => `${u.lowerBound ? 'at least ' : ''}${fmt(u.qUltKpa, 0)} kPa (${u.formula}; ${u.source})`);
  finding(w, 'Safe pressure in shear', f.shear, (s) => `${fmt(s.netSafeKpa, 0)} kPa net, ${fmt(s.grossSafeKpa, 0)} kPa gross (factor of safety ${s.factorOfSafety})`);
  finding(w, 'Safe pressure for settlement', f.settlement, (s) =>
    s.qKpa === null ? (s.reason ?? '–') : `${fmt(s.qKpa, 0)} kPa at a plate settlement of ${fmt(s.plateSettlementMm, 2)} mm (ratio ${fmt(s.ratio, 3)})`,
  );
  finding(w, 'Allowable bearing pressure', f.allowable, (q) => (q.qAllowKpa === null ? (q.reason ?? '–') : `${fmt(q.qAllowKpa, 0)} kPa net (${q.governs} governs)`));
  w.para(f.basis.statement, 8);
  if (f.widthForColumnLoad)
    finding(w, 'Square footing for the column load', f.widthForColumnLoad, (x) => `${fmt(x.widthM, 2)} m for ${fmt(x.columnLoadKn, 0)} kN (settlement limit only)`);
}

function moduli(w: SectionWriter, a: RecordAnalysis): void {
  const sg = a.subgradeModulus;
  const k = (m: LabelledModulus) => (m.kMnM3 === null ? (m.reason ?? '–') : `${fmt(m.kMnM3, 1)} MN/m³ at ${fmt(m.pressureKpa, 1)} kPa and ${fmt(m.settlementMm, 2)} mm (${m.formula}; ${m.source})`);
  finding(w, `k, ${sg.plateMm} mm plate, fixed settlement`, sg.atSettlement, (m) => `${k(m)}; settlement basis ${sg.settlementBasis}`);
  finding(w, `k, ${sg.plateMm} mm plate, 10 psi`, sg.atPressure, k);
  if (sg.atSettlement.applies)
    finding(w, 'k, 750/762 mm plate', sg.standardPlate, (s) => `${fmt(s.kMnM3, 1)} MN/m³: ${s.label} (${s.formula}; ${s.source})${s.caution ? `. ${s.caution}` : ''}`);
  if (sg.standardPlate.applies) finding(w, 'CBR estimate from that k', sg.cbrEstimate, (c) => `${fmt(c.cbrPercent, 1)} % (${c.formula}; ${c.source})`);
  if (sg.soaked) finding(w, `k, ${sg.plateMm} mm plate, soaked`, sg.soaked, (c) => `${fmt(c.kMnM3, 1)} MN/m³ (× ${fmt(c.factor, 3)}; ${c.formula}; ${c.source})`);
  finding(w, 'Deformation moduli', a.deformationModuli, (m) => `Ev1 ${fmt(m.ev1.evMnM2, 1)} MN/m², Ev2 ${fmt(m.ev2?.evMnM2, 1)} MN/m², Ev2/Ev1 ${fmt(m.ratio, 2)}; ${m.statement} (${m.source})`);
  if (a.deformationModuli.applies)
    finding(w, 'Ev acceptance', a.evAcceptance, (v) => `${v.passed ? 'met' : 'NOT met'} (${v.name}): ${v.checks.map((c) => c.message).join(' ')}`);
  finding(w, 'Elastic modulus', a.elasticModulus, (e) => `${fmt(e.eMpa, 1)} MPa (ν = ${e.poisson}; ${e.source})`);
  finding(w, 'Unload–reload modulus', a.unloadReloadModulus, (e) => `${fmt(e.eMpa, 1)} MPa, unloading ${fmt(e.toKpa, 0)} to ${fmt(e.fromKpa, 0)} kPa (ν = ${e.poisson}; ${e.source})`);
}

function cycles(w: SectionWriter, a: RecordAnalysis): void {
  if (!a.cycles.applies) return;
  w.para('Load–release cycles: total deflection under load, rebound on release and residual deflection, from the curve’s origin.', 8.5);
  w.table(
    ['Level, kPa', 'Application', 'Total, mm', 'Rebound, mm', 'Residual, mm', 'Added, mm'],
    a.cycles.result.map((c) => [fmt(c.levelKpa, 0), String(c.application), fmt(c.totalMm, 3), fmt(c.reboundMm, 3), fmt(c.residualMm, 3), fmt(c.residualIncrementMm, 3)]),
    [0.16, 0.16, 0.17, 0.17, 0.17, 0.17],
  );
}

/** The interpretation section of a current-shape analysis, with the saved version's choice. */
export function interpretationSection(w: SectionWriter, d: ReportData): void {
  const a = d.analysis;
  w.heading('Interpretation');
  w.field('Procedure', a.procedure.name);
  if (a.procedure.note) w.para(a.procedure.note, 8);
  const hidden = [...new Set(Object.values(a.procedure.methods).flatMap((s) => (s.shown ? [] : [s.why])))];
  if (hidden.length) w.para(`Not shown for this procedure: ${hidden.join('; ')}.`, 8);
  w.para(a.zeroCorrection.statement, 8);
  if (a.zeroCorrection.bedding) w.para(`${a.zeroCorrection.bedding.statement} (${a.zeroCorrection.bedding.formula}; ${a.zeroCorrection.bedding.source})`, 8);
  ultimate(w, a);
  if (d.interpretation) {
    const method = d.interpretation.chosenMethod ? (ULTIMATE_METHOD_NAMES[d.interpretation.chosenMethod as UltimateMethod] ?? d.interpretation.chosenMethod) : '–';
    w.field('Engineer’s choice', `${method} — ${d.interpretation.reason}`);
    w.field(
      'Interpretation version',
      `${d.interpretation.version}, saved by ${d.interpretation.byName ?? '–'} on ${d.interpretation.savedAt.toISOString().slice(0, 10)}`,
    );
  } else w.para('No interpretation has been saved: the figures are the defaults of every method.');
  footing(w, a);
  moduli(w, a);
  cycles(w, a);
  for (const s of a.scalingWarnings) w.para(`Note: ${s.message}`, 8);
}
