import type { Finding, FootingAnalysis, LabelledModulus, RecordAnalysis } from '@shared/interpretation/analyze-record';
import { STANDING_LEGEND, STANDING_WORDS } from '@shared/interpretation/ultimate-standing';
import { fixed, textTable } from './text-table';

const label = (name: string) => name.padEnd(38);
const line = (name: string, value: string) => `  ${label(name)}${value}`;
/** Why a figure is missing: a method the procedure does not call for says so in its own words. */
const notApplicable = (reason: string) => (reason.startsWith('not shown') ? reason : `not determined: ${reason}`);
const bullets = (items: readonly string[]) => items.map((item) => `  - ${item}`);
/** A legend under a table: what each column is. */
const legend = (items: readonly [string, string][]) => items.map(([column, meaning]) => `    ${column}: ${meaning}`);

function summary(a: RecordAnalysis, file: string): string[] {
  const m = a.summary.metadata;
  const facts = [
    ['Project', m.project],
    ['Client', m.client],
    ['Site', m.site],
    ['Pit', m.pit],
    ['Date', m.testDate],
    ['Crew', m.crew],
    ['Weather', m.weather],
    ['Procedure', a.procedure.name],
  ].filter((f): f is [string, string] => f[1] !== undefined);
  const { plate } = a.summary;
  const hidden = Object.values(a.procedure.methods).flatMap((s) => (s.shown ? [] : [s.why]));
  return [
    `Settlescope analysis of ${file}`,
    ...facts.map(([k, v]) => line(k, v)),
    line('Plate', `${plate.shape} ${plate.sizeMm} mm`),
    line('Record', `${a.summary.stages} stages, ${a.summary.readings} readings, gauges ${a.summary.gauges.join(', ')}`),
    ...(a.procedure.note ? [`  ${a.procedure.note}`] : []),
    ...(hidden.length ? ['  Not shown for this procedure:', ...bullets([...new Set(hidden)]).map((b) => `  ${b}`)] : []),
  ];
}

function stagePoints(a: RecordAnalysis): string[] {
  const rule = a.reduction.rule.kind === 'atTime' ? `read ${a.reduction.rule.minutes} min into each stage` : 'end of each hold';
  const rows = a.reduction.points.map((p) => [String(p.index), p.branch, fixed(p.pressureKpa, 1), fixed(p.settlementMm, 3), fixed(p.tMin, 2)]);
  return [
    `Load–settlement points (${rule})`,
    textTable(
      [
        { header: 'stage', align: 'right' },
        { header: 'branch' },
        { header: 'q (kPa)', align: 'right' },
        { header: 's (mm)', align: 'right' },
        { header: 't (min)', align: 'right' },
      ],
      rows,
    ),
    ...legend([
      ['q', 'pressure on the plate'],
      ['s', 'mean settlement of the gauges'],
      ['t', 'minutes after the stage’s target pressure was reached'],
    ]),
    `  ${a.zeroCorrection.statement}`,
    ...(a.zeroCorrection.bedding ? [`  ${a.zeroCorrection.bedding.statement}`] : []),
  ];
}

function ultimate(a: RecordAnalysis): string[] {
  if (!a.ultimate.applies) return ['Ultimate pressure of the plate', line('All methods', notApplicable(a.ultimate.reason))];
  const rows = a.ultimate.result.map((r) => [
    r.label,
    fixed(r.qUltKpa, 1),
    fixed(r.qOverQmax, 2),
    fixed(r.sUltMm, 2),
    fixed(r.sOverSmax, 2),
    STANDING_WORDS[r.standing],
    r.reason ?? '',
  ]);
  const extent = a.extent.applies ? a.extent.result : null;
  return [
    'Ultimate pressure of the plate (first loading, methods side by side)',
    textTable(
      [
        { header: 'method' },
        { header: 'q_ult (kPa)', align: 'right' },
        { header: 'q_ult/q_max', align: 'right' },
        { header: 's_ult (mm)', align: 'right' },
        { header: 's_ult/s_max', align: 'right' },
        { header: 'standing' },
        { header: 'note' },
      ],
      rows,
    ),
    ...legend([
      ['q_ult', 'the method’s ultimate pressure'],
      ['q_ult/q_max', `over the largest pressure tested${extent ? ` (${fixed(extent.qMaxKpa, 1)} kPa)` : ''}; above 1 lies beyond the test`],
      ['s_ult', 'the settlement the method puts at q_ult'],
      ['s_ult/s_max', `over the largest settlement measured${extent ? ` (${fixed(extent.sMaxMm, 2)} mm)` : ''}`],
      ['standing', 'ultimate (within a test that failed), yield pressure, extrapolated, beyond the test, or no value'],
    ]),
    `  ${STANDING_LEGEND}`,
    line('Carried to the footing checks', a.chosenUltimate.applies ? a.chosenUltimate.result.statement : notApplicable(a.chosenUltimate.reason)),
    finding('Undrained shear strength', a.undrainedStrength, (c) => c.statement),
  ];
}

function finding<T>(name: string, f: Finding<T>, show: (result: T) => string): string {
  return line(name, f.applies ? show(f.result) : notApplicable(f.reason));
}

function footing(a: RecordAnalysis): string[] {
  if (!a.footing.applies) return ['Footing', line('Scaling to a footing', notApplicable(a.footing.reason))];
  const f: FootingAnalysis = a.footing.result;
  const { footing: ft } = f;
  const width = f.widthForColumnLoad;
  return [
    `Footing: ${ft.shape} ${ft.widthM} m on ${ft.soilBehaviour} soil, from the ${f.plateLabel}`,
    finding('Ultimate pressure of the footing', f.ultimate, (u) =>
      `${u.lowerBound ? 'at least ' : ''}${fixed(u.qUltKpa, 1)} kPa${u.shape ? ` (shape factor ${fixed(u.shape.factor, 3)})` : ''}`,
    ),
    finding('Safe pressure in shear', f.shear, (s) => `${fixed(s.netSafeKpa, 1)} kPa net, ${fixed(s.grossSafeKpa, 1)} kPa gross (factor of safety ${s.factorOfSafety})`),
    finding('Safe pressure for settlement', f.settlement, (s) =>
      s.qKpa === null ? (s.reason ?? '—') : `${fixed(s.qKpa, 1)} kPa (plate settlement ${fixed(s.plateSettlementMm, 2)} mm, ratio ${fixed(s.ratio, 3)})`,
    ),
    finding('Allowable bearing pressure', f.allowable, (q) =>
      q.qAllowKpa === null ? (q.reason ?? '—') : `${fixed(q.qAllowKpa, 1)} kPa net (${q.governs === 'shear' ? 'shear' : 'settlement'} governs)`,
    ),
    `  ${f.basis.statement}`,
    ...(width ? [finding('Square footing for the column load', width, (w) => `${fixed(w.widthM, 2)} m wide for ${fixed(w.columnLoadKn, 0)} kN (${fixed(w.bearingPressureKpa, 1)} kPa; settlement limit only, check it against the allowable pressure)${w.limitedByTestRange ? '; the test stopped short, so the width is on the safe side' : ''}`)] : []),
  ];
}

function moduli(a: RecordAnalysis): string[] {
  const sg = a.subgradeModulus;
  const k = (m: LabelledModulus) => (m.kMnM3 === null ? (m.reason ?? '—') : `${fixed(m.kMnM3, 2)} MN/m³ (${fixed(m.kPci, 0)} pci) at ${fixed(m.pressureKpa, 1)} kPa, ${fixed(m.settlementMm, 2)} mm`);
  const name = (f: Finding<LabelledModulus>, fallback: string) => (f.applies ? f.result.label : fallback);
  const plate = `k, ${sg.plateMm} mm plate`;
  return [
    'Moduli',
    finding(`${name(sg.atSettlement, plate)}, fixed settlement`, sg.atSettlement, k),
    ...(sg.atSettlement.applies ? [`    settlement basis ${sg.settlementBasis}; loading curve from application ${sg.application} of each load level`] : []),
    finding(`${name(sg.atPressure, plate)}, 10 psi`, sg.atPressure, k),
    finding('k, 750/762 mm plate', sg.standardPlate, (s) => `${fixed(s.kMnM3, 2)} MN/m³ (${fixed(s.kPci, 0)} pci): ${s.label}${s.caution ? `. ${s.caution}` : ''}`),
    ...(sg.standardPlate.applies ? [finding('CBR estimate from that k', sg.cbrEstimate, (c) => `${fixed(c.cbrPercent, 1)} % (${c.source})`)] : []),
    ...(sg.soaked ? [finding(`k, ${sg.plateMm} mm plate, soaked`, sg.soaked, (c) => `${fixed(c.kMnM3, 2)} MN/m³ (× ${fixed(c.factor, 3)}; ${c.source})`)] : []),
    finding('Ev1 / Ev2 / Ev2÷Ev1', a.deformationModuli, (d) => `${fixed(d.ev1.evMnM2, 1)} / ${fixed(d.ev2?.evMnM2, 1)} MN/m² / ${fixed(d.ratio, 2)}`),
    ...(a.deformationModuli.applies ? [`    ${a.deformationModuli.result.statement}`] : []),
    ...(a.deformationModuli.applies
      ? [finding('Ev acceptance', a.evAcceptance, (v) => `${v.passed ? 'met' : 'NOT met'} (${v.name}): ${v.checks.map((c) => c.message).join(' ')}`)]
      : []),
    finding('Elastic modulus E', a.elasticModulus, (e) => `${fixed(e.eMpa, 1)} MPa (ν = ${e.poisson}, secant ${fixed(e.fromKpa, 0)}–${fixed(e.toKpa, 0)} kPa)`),
    finding('Unload–reload modulus E_ur', a.unloadReloadModulus, (e) => `${fixed(e.eMpa, 1)} MPa (ν = ${e.poisson}, unloading ${fixed(e.toKpa, 0)}→${fixed(e.fromKpa, 0)} kPa)`),
  ];
}

function cycles(a: RecordAnalysis): string[] {
  if (!a.cycles.applies) return [];
  const rows = a.cycles.result.map((c) => [
    fixed(c.levelKpa, 1),
    String(c.application),
    fixed(c.totalMm, 3),
    fixed(c.reboundMm, 3),
    fixed(c.residualMm, 3),
    fixed(c.residualIncrementMm, 3),
    fixed(c.elasticFraction, 2),
  ]);
  return [
    'Load–release cycles (repeated loading)',
    textTable(
      [
        { header: 'level (kPa)', align: 'right' },
        { header: 'application', align: 'right' },
        { header: 'total (mm)', align: 'right' },
        { header: 'rebound (mm)', align: 'right' },
        { header: 'residual (mm)', align: 'right' },
        { header: 'residual added (mm)', align: 'right' },
        { header: 'rebound/total', align: 'right' },
      ],
      rows,
    ),
    ...legend([
      ['total', 'deflection under load, from the curve’s origin'],
      ['rebound', 'recovered on release'],
      ['residual', 'left after release; residual added: by this cycle'],
    ]),
  ];
}

function timeSettlement(a: RecordAnalysis): string[] {
  if (a.timeSettlement.length === 0) return [];
  const rows = a.timeSettlement.map((t) => [
    String(t.index),
    fixed(t.targetKpa, 1),
    String(t.readings),
    fixed(t.lastTMin, 1),
    t.creep.applies ? fixed(t.creep.result.ksMm, 3) : '—',
    t.hyperbolicFit.applies ? fixed(t.hyperbolicFit.result.ultimateIncrementMm, 3) : '—',
    t.hyperbolicFit.applies ? fixed(t.hyperbolicFit.result.percentOfUltimate, 1) : '—',
  ]);
  return [
    'Time–settlement of the loading and reloading stages',
    textTable(
      [
        { header: 'stage', align: 'right' },
        { header: 'target (kPa)', align: 'right' },
        { header: 'readings', align: 'right' },
        { header: 'hold (min)', align: 'right' },
        { header: 'creep (mm/log cycle)', align: 'right' },
        { header: 'Δs_ult (mm)', align: 'right' },
        { header: 'reached (%)', align: 'right' },
      ],
      rows,
    ),
    ...legend([
      ['creep', 'settlement per tenfold of time over the last log cycle of the hold'],
      ['Δs_ult', 'the stage’s final settlement increment by a hyperbolic time fit; reached: how much of it the hold saw'],
    ]),
  ];
}

/** The key results of an analysis as plain text with aligned columns and units, each column explained, then the warnings and cautions. */
export function renderAnalysis(a: RecordAnalysis, file: string): string {
  const sections = [
    summary(a, file),
    stagePoints(a),
    ultimate(a),
    footing(a),
    moduli(a),
    cycles(a),
    timeSettlement(a),
    a.scalingWarnings.length > 0 ? ['Scaling warnings', ...bullets(a.scalingWarnings.map((w) => w.message))] : [],
    ['Cautions', ...bullets(a.cautions.map((c) => c.message))],
    ['Formulas and sources of every figure: run with --json.'],
  ];
  return `${sections
    .filter((s) => s.length > 0)
    .map((s) => s.join('\n'))
    .join('\n\n')}\n`;
}
