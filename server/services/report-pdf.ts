/**
 * The PDF report of a run: site and plan, pit and reaction, instruments, photos, stage-end readings, vector plots,
 * the interpretation with its sources, the cautions, remarks and the sign-off block with the data hash.
 * Text is Helvetica; figures, readings and the hash are JetBrains Mono (embedded from its woff).
 */
import path from 'node:path';
import PDFDocument from 'pdfkit';
import { describeHoldRule } from '../../shared/hold/criterion';
import { STANDING_CAUTIONS } from '../../shared/interpretation/analyze-record';
import { ROOT_DIR } from '../config';
import { type Doc, drawPlot, type PlotSeries } from './pdf-plot';
import { interpretationSection as currentInterpretationSection, isCurrentAnalysis } from './report-interpretation';
import { toWinAnsi } from './pdf-text';
import type { ReportData, ReportImage, ReportPhoto } from './report-data';

const FONT_DIR = path.join(ROOT_DIR, 'node_modules/@fontsource/jetbrains-mono/files');
const MARGIN = 48;
/** JetBrains Mono's programming ligatures (<=, ->, //) are not in the web subset; fontkit fails on them, and figures should not fuse anyway. */
const NO_LIGATURES = { features: { calt: false, liga: false } as unknown as PDFKit.Mixins.OpenTypeFeatures[] };

/** A number with fixed decimals, or an en dash when there is none. */
const fmt = (x: number | null | undefined, digits = 1) => (x === null || x === undefined || !Number.isFinite(x) ? '–' : x.toFixed(digits));
const mean = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;

class ReportWriter {
  readonly doc: Doc;
  constructor() {
    this.doc = new PDFDocument({ size: 'A4', margin: MARGIN, info: { Title: 'Plate load test report', Creator: 'Settlescope' } });
    this.doc.registerFont('Mono', path.join(FONT_DIR, 'jetbrains-mono-latin-400-normal.woff'));
    this.doc.registerFont('Mono-Bold', path.join(FONT_DIR, 'jetbrains-mono-latin-700-normal.woff'));
  }

  get width() {
    return this.doc.page.width - 2 * MARGIN;
  }

  /** Starts a new page when fewer than `points` remain. */
  room(points: number): void {
    if (this.doc.y + points > this.doc.page.height - MARGIN) this.doc.addPage();
  }

  heading(text: string): void {
    this.room(60);
    this.doc.moveDown(0.8).font('Helvetica-Bold').fontSize(12).fillColor('#000').text(toWinAnsi(text), MARGIN);
    this.doc
      .moveTo(MARGIN, this.doc.y + 1)
      .lineTo(MARGIN + this.width, this.doc.y + 1)
      .lineWidth(0.5)
      .stroke();
    this.doc.moveDown(0.4);
  }

  /** "Label: value" lines; the value in the mono face when it is a figure. */
  field(label: string, value: string, mono = false): void {
    this.room(14);
    this.doc
      .font('Helvetica-Bold')
      .fontSize(9)
      .text(`${toWinAnsi(label)}: `, MARGIN, this.doc.y, { continued: true });
    this.doc.font(mono ? 'Mono' : 'Helvetica').text(mono ? value : toWinAnsi(value), NO_LIGATURES);
  }

  para(text: string, size = 9): void {
    this.room(14);
    this.doc.font('Helvetica').fontSize(size).text(toWinAnsi(text), MARGIN, this.doc.y, { width: this.width });
  }

  /** Places a JPEG scaled to fit `maxWidth` × `maxHeight` at (x, y); returns the size drawn. */
  image(img: ReportImage, x: number, y: number, maxWidth: number, maxHeight: number): { width: number; height: number } {
    const scale = Math.min(maxWidth / img.width, maxHeight / img.height);
    const size = { width: img.width * scale, height: img.height * scale };
    this.doc.image(img.jpeg, x, y, size);
    return size;
  }

  /** A table with a bold header row; columns share the width by the given fractions. */
  table(header: string[], rows: string[][], fractions: number[]): void {
    const widths = fractions.map((f) => f * this.width);
    const row = (raw: string[], bold: boolean) => {
      const cells = raw.map(toWinAnsi);
      this.room(13);
      const y = this.doc.y;
      let x = MARGIN;
      this.doc.font(bold ? 'Helvetica-Bold' : 'Mono').fontSize(bold ? 8 : 7.5);
      const heights = cells.map((c, i) => this.doc.heightOfString(c, { width: widths[i] - 4, ...NO_LIGATURES }));
      cells.forEach((c, i) => {
        this.doc.text(c, x, y, { width: widths[i] - 4, ...NO_LIGATURES });
        x += widths[i];
      });
      this.doc.x = MARGIN;
      this.doc.y = y + Math.max(...heights) + 2;
    };
    row(header, true);
    for (const r of rows) row(r, false);
    this.doc.moveDown(0.3);
  }
}

function titleBlock(w: ReportWriter, d: ReportData): void {
  w.doc.font('Helvetica-Bold').fontSize(18).text('Plate load test report');
  w.doc
    .font('Helvetica')
    .fontSize(10)
    .text(toWinAnsi(`${d.project.code} · ${d.project.name} · pit ${d.location.pitId} · run ${d.runId}`));
  w.doc
    .font('Helvetica')
    .fontSize(8)
    .fillColor('#52606d')
    .text(`Generated ${d.generatedAt.toISOString().replace('T', ' ').slice(0, 19)} UTC · revision ${d.signoff.revision} · ${d.signoff.state}`);
  w.doc.fillColor('#000');
}

function siteSection(w: ReportWriter, d: ReportData): void {
  const l = d.location;
  w.heading('Project and site');
  w.field('Client', d.clientName || '–');
  w.field('Project', `${d.project.code} ${d.project.name}`);
  w.field('Site', [d.project.site, d.project.address].filter(Boolean).join(', ') || '–');
  w.field('Test location', `pit ${l.pitId}, test depth ${fmt(l.testDepthM, 2)} m below ground`);
  if (l.latitude !== null && l.longitude !== null) w.field('Coordinates', `${fmt(l.latitude, 6)}, ${fmt(l.longitude, 6)} (WGS 84)`, true);
  if (l.planX !== null && l.planY !== null) w.field('Site-plan pin', `${fmt(l.planX * 100, 1)} % across, ${fmt(l.planY * 100, 1)} % down the site plan`, true);
  w.field('Water table', l.waterTableDepthM === null ? 'not met / not recorded' : `${fmt(l.waterTableDepthM, 2)} m below ground`);
  w.field('Soil', l.soilDescription || d.record.ground?.description || '–');
  w.field('Test date', d.testDate ?? '–');
  w.field('Weather', d.record.metadata?.weather || 'not recorded');
  w.field('Crew', d.crew.join(', ') || 'not recorded (imported test)');
  if (d.sitePlan) sitePlanFigure(w, d.sitePlan, l.planX !== null && l.planY !== null ? { x: l.planX, y: l.planY, label: `pit ${l.pitId}` } : null);
}

/** The site plan with the test location's pin (a ringed dot and its label) where the engineer placed it. */
function sitePlanFigure(w: ReportWriter, plan: ReportImage, pin: { x: number; y: number; label: string } | null): void {
  w.room(230);
  const top = w.doc.y + 6;
  const size = w.image(plan, MARGIN, top, w.width, 220);
  w.doc.rect(MARGIN, top, size.width, size.height).lineWidth(0.5).strokeColor('#000').stroke();
  if (pin) {
    const px = MARGIN + pin.x * size.width;
    const py = top + pin.y * size.height;
    w.doc.circle(px, py, 6).lineWidth(2).fillAndStroke('#c1121f', '#ffffff');
    w.doc.font('Helvetica-Bold').fontSize(8).fillColor('#000').text(toWinAnsi(pin.label), px + 9, py - 4, { lineBreak: false });
  }
  w.doc.fillColor('#000').strokeColor('#000');
  w.doc.x = MARGIN;
  w.doc.y = top + size.height + 4;
  w.para(pin ? 'Site plan with the test location pinned.' : 'Site plan (the test location is not pinned on it).', 7.5);
}

function pitSection(w: ReportWriter, d: ReportData): void {
  const l = d.location;
  const p = d.plan.input;
  w.heading('Pit and reaction');
  w.field('Pit', `${l.pitId}, ${l.pitWidthM === null ? 'width not recorded' : `${fmt(l.pitWidthM, 2)} m wide`}, plate at ${fmt(l.testDepthM, 2)} m below ground`);
  w.field('Reaction', `${p.reaction.kind}, stated capacity ${fmt(p.reaction.capacityKn, 0)} kN${p.reaction.description ? ` (${p.reaction.description})` : ''}`);
  w.field('Apparatus on the plate', `${fmt(p.apparatusWeightKn, 2)} kN (column, spacers and jack body; added to the jack load)`);
  w.para(
    'The reaction capacity is as stated in the plan, not measured. Its adequacy and the safety of the set-up rest with the engineer in charge under local rules.',
    7.5,
  );
}

function photoSection(w: ReportWriter, d: ReportData): void {
  if (d.photos.length) w.room(290); // keep the heading with the first row of photos
  w.heading('Photos');
  if (!d.photos.length) {
    w.para('No photos were attached to this test.');
    return;
  }
  const gap = 16;
  const cell = (w.width - gap) / 2;
  for (let i = 0; i < d.photos.length; i += 2) {
    const row = d.photos.slice(i, i + 2);
    w.room(230);
    const top = w.doc.y;
    const bottoms = row.map((photo, k) => photoFigure(w, photo, MARGIN + k * (cell + gap), top, cell));
    w.doc.x = MARGIN;
    w.doc.y = Math.max(...bottoms) + 10;
  }
}

/** One photo in its cell with its caption, who added it and when, and its SHA-256; returns the bottom edge. */
function photoFigure(w: ReportWriter, photo: ReportPhoto, x: number, top: number, width: number): number {
  const size = w.image(photo.image, x, top, width, 170);
  const kind = photo.kind === 'site' ? 'Site' : 'Pit';
  const caption = `${kind}${photo.ofRun ? ' (this run)' : ''}: ${photo.caption || 'no caption'}`;
  w.doc.font('Helvetica-Bold').fontSize(8).fillColor('#000').text(toWinAnsi(caption), x, top + size.height + 3, { width });
  const added = `Added ${photo.addedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC${photo.takenBy ? ` by ${photo.takenBy}` : ''}`;
  w.doc.font('Helvetica').fontSize(7).fillColor('#52606d').text(toWinAnsi(added), x, w.doc.y, { width });
  w.doc.font('Mono').fontSize(6).text(`SHA-256 ${photo.sha256}`, x, w.doc.y, { width, ...NO_LIGATURES });
  w.doc.fillColor('#000');
  return w.doc.y;
}

function planSection(w: ReportWriter, d: ReportData): void {
  const p = d.plan.input;
  w.heading('Plan and procedure');
  w.field('Plan', d.plan.name);
  w.field('Procedure profile', d.plan.profileName ? `${d.plan.profileName} (${d.plan.profileFamily})` : p.procedureId);
  w.field('Plate', `${p.plate.shape}, ${p.plate.sizeMm} mm, ${p.plate.thicknessMm} mm thick`);
  w.field('Seating pressure', `${fmt(p.seatingPressureKpa, 0)} kPa`);
  w.field('Hold rule', describeHoldRule(p.holdRule));
  if (d.plan.sources.length) {
    w.para('Sources of the profile’s defaults:', 8.5);
    for (const s of d.plan.sources) w.para(`• ${s.setting}: ${s.text} [${s.tag}]`, 8);
  }
}

function instrumentSection(w: ReportWriter, d: ReportData): void {
  w.heading('Instruments and calibration');
  if (!d.instruments.length) {
    w.para(d.rigName ? `Rig ${d.rigName}: no instruments registered on its channels.` : 'Imported test: the instruments were not recorded with it.');
    return;
  }
  if (d.rigName) w.field('Rig', d.rigName);
  w.table(
    ['Channel', 'Role', 'Instrument', 'Serial', 'Calibrated', 'Due'],
    d.instruments.map((i) => [i.channel, i.role, i.instrument ?? '–', i.serialNumber ?? '–', i.calibratedOn ?? '–', i.dueOn ?? '–']),
    [0.18, 0.1, 0.26, 0.18, 0.14, 0.14],
  );
}

function readingsSection(w: ReportWriter, d: ReportData): void {
  const points = d.analysis.reduction.points;
  const gauges = d.analysis.summary.gauges;
  w.heading('Stage-end readings');
  w.para(`${d.analysis.reduction.formula} (${d.analysis.reduction.source}). Every reading is in the attached CSV.`, 8);
  const share = 0.5 / Math.max(1, gauges.length);
  w.table(
    ['Stage', 'Branch', 't, min', 'q, kPa', 's mean, mm', ...gauges.map((g) => `${g}, mm`)],
    points.map((p) => [String(p.index), p.branch, fmt(p.tMin, 1), fmt(p.pressureKpa, 1), fmt(p.settlementMm, 3), ...p.gaugesMm.map((g) => fmt(g, 3))]),
    [0.08, 0.12, 0.1, 0.1, 0.1, ...gauges.map(() => share)],
  );
}

function plotSection(w: ReportWriter, d: ReportData): void {
  w.heading('Plots');
  w.room(220);
  const y = w.doc.y;
  const half = (w.width - 16) / 2;
  const curve: PlotSeries = { label: 'stage ends', points: d.analysis.reduction.points.map((p) => [p.pressureKpa, p.settlementMm] as const) };
  drawPlot(w.doc, [curve], {
    x: MARGIN,
    y,
    width: half,
    height: 200,
    title: 'Load–settlement',
    xLabel: 'plate pressure q, kPa',
    yLabel: 'settlement s, mm',
    yDown: true,
  });
  const timeSeries: PlotSeries[] = d.record.stages
    .filter((s) => s.branch === 'loading' || s.branch === 'reloading')
    .map((s) => ({ label: `${fmt(s.targetKpa, 0)} kPa`, points: s.readings.map((r) => [r.tMin, mean(Object.values(r.gauges))] as const) }));
  drawPlot(w.doc, timeSeries, {
    x: MARGIN + half + 16,
    y,
    width: half,
    height: 200,
    title: 'Time–settlement (each held stage)',
    xLabel: 'time since target reached, min',
    yLabel: 'settlement s, mm',
    yDown: true,
  });
  w.doc.x = MARGIN;
  w.doc.y = y + 210;
}

/** The interpretation section: the current analysis's own (report-interpretation.ts), or as signed for one saved before it. */
function interpretationSection(w: ReportWriter, d: ReportData): void {
  if (isCurrentAnalysis(d.analysis)) {
    currentInterpretationSection(w, d);
    return;
  }
  const a = d.analysis;
  w.heading('Interpretation');
  if (a.ultimate.applies) {
    w.table(
      ['Method', 'q_ult, kPa', 'Formula and source'],
      a.ultimate.result.map((u) => [u.label, fmt(u.qUltKpa, 0), `${u.formula}. ${u.source}${u.reason ? ` (${u.reason})` : ''}`]),
      [0.22, 0.12, 0.66],
    );
  } else w.para(`Ultimate pressure: ${a.ultimate.reason}`);
  if (a.chosenUltimate.applies) {
    const c = a.chosenUltimate.result;
    w.field(
      'Ultimate pressure carried forward',
      `${fmt(c.qUltKpa, 0)} kPa by ${c.label} (${c.basis === 'engineer' ? 'the engineer’s choice' : 'lowest of the methods'})`,
    );
  }
  if (d.interpretation) {
    w.field('Engineer’s choice', `${d.interpretation.chosenMethod ?? '–'} — ${d.interpretation.reason}`);
    w.field(
      'Interpretation version',
      `${d.interpretation.version}, saved by ${d.interpretation.byName ?? '–'} on ${d.interpretation.savedAt.toISOString().slice(0, 10)}`,
    );
  } else w.para('No interpretation has been saved: the figures are the defaults of every method.');
  if (a.footing.applies) {
    const f = a.footing.result;
    w.field('Footing', `${f.footing.shape}, ${fmt(f.footing.widthM, 2)} m wide, ${f.footing.soilBehaviour} soil`);
    if (f.allowable.applies)
      w.field('Allowable bearing pressure', `${fmt(f.allowable.result.qAllowKpa, 0)} kPa (${f.allowable.result.governs ?? '–'} governs)`);
  }
  const k = a.subgradeModulus.atSettlement;
  if (k.applies && k.result.kMnM3 !== null)
    w.field('Modulus of subgrade reaction', `${fmt(k.result.kMnM3, 1)} MN/m³ (${k.result.formula}; ${k.result.source})`);
  const ev = a.deformationModuli;
  if (ev.applies) {
    const m = ev.result;
    w.field('Deformation moduli', `Ev1 ${fmt(m.ev1.evMnM2, 1)} MN/m², Ev2 ${fmt(m.ev2?.evMnM2, 1)} MN/m², Ev2/Ev1 ${fmt(m.ratio, 2)} (${m.source})`);
  }
  if (a.elasticModulus.applies)
    w.field('Elastic modulus', `${fmt(a.elasticModulus.result.eMpa, 1)} MPa (ν = ${a.elasticModulus.result.poisson}; ${a.elasticModulus.result.source})`);
  for (const s of a.scalingWarnings) w.para(`Note: ${s.message}`, 8);
}

function cautionSection(w: ReportWriter, d: ReportData): void {
  w.heading('Cautions');
  const codes = new Set(d.analysis.cautions.map((c) => c.code));
  const cautions = [...STANDING_CAUTIONS.filter((c) => !codes.has(c.code)), ...d.analysis.cautions];
  for (const c of cautions) w.para(`• ${c.message}`, 8.5);
}

function remarksSection(w: ReportWriter, d: ReportData): void {
  w.heading('Remarks');
  const remarks = [...d.remarks, ...(d.location.notes ? [d.location.notes] : [])];
  if (!remarks.length) w.para('None.');
  for (const r of remarks) w.para(`• ${r}`, 8.5);
}

function signoffSection(w: ReportWriter, d: ReportData): void {
  const s = d.signoff;
  w.heading('Review and sign-off');
  w.field('State', `${s.state}, revision ${s.revision}${s.interpretationVersion !== null ? `, interpretation version ${s.interpretationVersion}` : ''}`);
  if (!s.signatures.length) w.para('Not signed. This report is a draft and must not be relied on.');
  for (const sig of s.signatures) {
    w.room(40);
    w.field(`Revision ${sig.revision}, ${sig.meaning}`, `${sig.signerName}, ${sig.signedAt.replace('T', ' ').replace(/\.\d+Z$/, '')} UTC`);
    w.field('SHA-256 of the data', sig.dataHash, true);
  }
  for (const r of s.revisions) w.para(`Revision ${r.revision} opened ${r.at.slice(0, 10)}: ${r.reason}`, 8.5);
  w.para(
    'The hash covers everything this report shows (record, interpretation, project, location, instruments and calibrations, site plan and photos by their SHA-256) as canonical JSON (sorted keys), sealed at signing; GET /api/runs/:id/verify checks it from storage.',
    7.5,
  );
}

/** The PDF report of a run as bytes. */
export function renderReportPdf(d: ReportData): Promise<Buffer> {
  const w = new ReportWriter();
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    w.doc.on('data', (c: Buffer) => chunks.push(c));
    w.doc.on('end', () => resolve(Buffer.concat(chunks)));
    w.doc.on('error', reject);
  });
  titleBlock(w, d);
  siteSection(w, d);
  planSection(w, d);
  pitSection(w, d);
  instrumentSection(w, d);
  photoSection(w, d);
  readingsSection(w, d);
  plotSection(w, d);
  interpretationSection(w, d);
  cautionSection(w, d);
  remarksSection(w, d);
  signoffSection(w, d);
  w.doc.end();
  return done;
}
