import type { Finding, FootingAnalysis, RecordAnalysis } from '@shared/interpretation/analyze-record';
import type { SubgradeModulus } from '@shared/interpretation/subgrade';
import { fixed, textTable } from './text-table';

const label = (name: string) => name.padEnd(38);
const line = (name: string, value: string) => `  ${label(name)}${value}`;
const notApplicable = (reason: string) => `not applicable: ${reason}`;
const bullets = (items: readonly string[]) => items.map((item) => `  - ${item}`);

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
    ['Procedure', a.summary.procedureId ?? undefined],
  ].filter((f): f is [string, string] => f[1] !== undefined);
  const { plate } = a.summary;
  return [
    `Settlescope analysis of ${file}`,
    ...facts.map(([k, v]) => line(k, v)),
    line('Plate', `${plate.shape} ${plate.sizeMm} mm`),
    line('Record', `${a.summary.stages} stages, ${a.summary.readings} readings, gauges ${a.summary.gauges.join(', ')}`),
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
  ];
}

function ultimate(a: RecordAnalysis): string[] {
  if (!a.ultimate.applies) return ['Ultimate pressure', line('All methods', notApplicable(a.ultimate.reason))];
  const rows = a.ultimate.result.map((r) => [r.label, fixed(r.qUltKpa, 1), fixed(r.sUltMm, 2), r.reason ?? '']);
  const chosen = a.chosenUltimate.applies
    ? `${a.chosenUltimate.result.label}, ${fixed(a.chosenUltimate.result.qUltKpa, 1)} kPa (${a.chosenUltimate.result.basis === 'lowest' ? 'the lowest of the methods' : "the engineer's choice"})`
    : notApplicable(a.chosenUltimate.reason);
  return [
    'Ultimate pressure of the plate (first loading, methods side by side)',
    textTable([{ header: 'method' }, { header: 'q_ult (kPa)', align: 'right' }, { header: 's (mm)', align: 'right' }, { header: 'note' }], rows),
    line('Chosen for the footing checks', chosen),
  ];
}

function finding<T>(name: string, f: Finding<T>, show: (result: T) => string): string {
  return line(name, f.applies ? show(f.result) : notApplicable(f.reason));
}

function footing(a: RecordAnalysis): string[] {
  if (!a.footing.applies) return ['Footing', line('Scaling', notApplicable(a.footing.reason))];
  const f: FootingAnalysis = a.footing.result;
  const { footing: ft } = f;
  return [
    `Footing: ${ft.shape} ${ft.widthM} m on ${ft.soilBehaviour} soil (settlement scaling: ${f.scaling.kind})`,
    finding('Ultimate pressure of the footing', f.ultimate, (u) => `${fixed(u.qUltKpa, 1)} kPa`),
    finding('Safe pressure in shear', f.shear, (s) => `${fixed(s.netSafeKpa, 1)} kPa net, ${fixed(s.grossSafeKpa, 1)} kPa gross (FS ${s.factorOfSafety})`),
    finding('Safe pressure for settlement', f.settlement, (s) =>
      s.qKpa === null ? (s.reason ?? '—') : `${fixed(s.qKpa, 1)} kPa (plate settlement ${fixed(s.plateSettlementMm, 2)} mm, ratio ${fixed(s.ratio, 3)})`,
    ),
    finding('Allowable bearing pressure', f.allowable, (q) =>
      q.qAllowKpa === null ? (q.reason ?? '—') : `${fixed(q.qAllowKpa, 1)} kPa (${q.governs} governs)`,
    ),
  ];
}

function moduli(a: RecordAnalysis): string[] {
  const k = (m: SubgradeModulus) => (m.kMnM3 === null ? (m.reason ?? '—') : `${fixed(m.kMnM3, 2)} MN/m³ (${fixed(m.kPci, 0)} pci)`);
  return [
    'Moduli',
    finding('k at 1.25 mm', a.subgradeModulus.atSettlement, k),
    finding('k at 10 psi (68.95 kPa)', a.subgradeModulus.atPressure, k),
    finding('Ev1 / Ev2 / Ev2÷Ev1', a.deformationModuli, (d) => `${fixed(d.ev1.evMnM2, 1)} / ${fixed(d.ev2?.evMnM2, 1)} MN/m² / ${fixed(d.ratio, 2)}`),
    finding('Elastic modulus E', a.elasticModulus, (e) => `${fixed(e.eMpa, 1)} MPa (ν = ${e.poisson}, secant ${fixed(e.fromKpa, 0)}–${fixed(e.toKpa, 0)} kPa)`),
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
    'Time–settlement of the loading and reloading stages (creep over the last log cycle of each hold; hyperbolic time fit)',
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
  ];
}

/** The key results of an analysis as plain text with aligned columns and units, then the warnings and cautions. */
export function renderAnalysis(a: RecordAnalysis, file: string): string {
  const sections = [
    summary(a, file),
    stagePoints(a),
    ultimate(a),
    footing(a),
    moduli(a),
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
