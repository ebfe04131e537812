/**
 * Everything the PDF report of a run shows, gathered from the database in one place so that the
 * renderer stays a function of plain data.
 */
import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { analyzeRecord, type RecordAnalysis } from '../../shared/interpretation/analyze-record';
import { findProfile, type SettingSource } from '../../shared/procedures/profiles';
import type { TestRecord } from '../../shared/records/schema';
import type { RunSetupSnapshot } from '../../shared/runs/measurement-model';
import type { PlanInput } from '../../shared/schemas/plans';
import type { PhotoKind } from '../../shared/schemas/photos';
import type { SignoffView } from '../../shared/schemas/signoff';
import { notFound } from '../http/errors';
import { uploadDir } from '../http/uploads';
import { CalibrationRecord } from '../models/calibration-record';
import { Instrument } from '../models/instrument';
import { Interpretation } from '../models/interpretation';
import { Organization } from '../models/organization';
import { Project } from '../models/project';
import { Rig } from '../models/rig';
import { Run } from '../models/run';
import { RunEvent } from '../models/run-event';
import { TestLocation } from '../models/test-location';
import { TestPlan } from '../models/test-plan';
import { User } from '../models/user';
import { PhotoFiles, photosOfRun } from './photos';
import { loadRunRecord } from './run-record';
import { signoffView } from './signoff';

/** One instrument line: the rig channel, what is fitted on it, and its calibration in force. */
export interface ReportInstrument {
  channel: string;
  role: string;
  instrument: string | null;
  serialNumber: string | null;
  /** The calibration record in force (its id), so a signed snapshot names the very version used. */
  calibrationId: number | null;
  calibratedOn: string | null;
  dueOn: string | null;
}

export interface ReportData {
  runId: number;
  generatedAt: Date;
  project: { code: string; name: string; site: string; address: string };
  clientName: string;
  location: {
    pitId: string;
    latitude: number | null;
    longitude: number | null;
    planX: number | null;
    planY: number | null;
    testDepthM: number;
    waterTableDepthM: number | null;
    pitWidthM: number | null;
    soilDescription: string;
    notes: string;
  };
  testDate: string | null;
  crew: string[];
  plan: { name: string; input: PlanInput; profileName: string | null; profileFamily: string | null; sources: SettingSource[] };
  rigName: string | null;
  instruments: ReportInstrument[];
  record: TestRecord;
  analysis: RecordAnalysis;
  /** The saved interpretation shown (the version under review or signed, else the newest); null when none is saved. */
  interpretation: { version: number; options: Record<string, unknown>; chosenMethod: string | null; reason: string; byName: string | null; savedAt: Date } | null;
  remarks: string[];
  signoff: SignoffView;
  /** The location's site plan, scaled down for print, when one is uploaded. */
  sitePlan: ReportImage | null;
  photos: ReportPhoto[];
}

/** A JPEG ready to embed, with its size (the report uses only its shape). */
export interface ReportImage {
  jpeg: Buffer;
  width: number;
  height: number;
}

export interface ReportPhoto {
  image: ReportImage;
  kind: PhotoKind;
  caption: string;
  /** True for a photo taken for this run, false for one of the location. */
  ofRun: boolean;
  takenBy: string | null;
  addedAt: Date;
  sha256: string;
}

/** The site plan as a print-size JPEG; null when there is none or its file cannot be read. */
async function sitePlanImage(dataDir: string, file: string | null): Promise<ReportImage | null> {
  if (!file) return null;
  try {
    const { data, info } = await sharp(path.join(uploadDir(dataDir, 'site-plans'), path.basename(file)))
      .resize(1600, 1600, { fit: 'inside', withoutEnlargement: true })
      .flatten({ background: '#ffffff' })
      .jpeg({ quality: 85 })
      .toBuffer({ resolveWithObject: true });
    return { jpeg: data, width: info.width, height: info.height };
  } catch {
    return null;
  }
}

/** The photos the report shows, with their preview renditions. */
async function reportPhotos(dataDir: string, runId: number, locationId: number): Promise<ReportPhoto[]> {
  const files = new PhotoFiles(dataDir);
  return Promise.all(
    (await photosOfRun(runId, locationId)).map(async (p) => {
      return {
        // The preview is the upload scaled down, upright: the upload's upright size gives its shape.
        image: { jpeg: await readFile(files.path(p, 'preview')), width: p.width, height: p.height },
        kind: p.kind,
        caption: p.caption,
        ofRun: p.runId === runId,
        takenBy: p.uploader?.name ?? null,
        addedAt: p.createdAt,
        sha256: p.sha256,
      };
    }),
  );
}

/**
 * The instruments a run used: its set-up snapshot's channels and calibration versions when it has one
 * (a later calibration or rig change is not what the test was measured with), else the rig as it stands.
 */
async function instrumentsOf(rig: Rig | null, setup: RunSetupSnapshot | undefined): Promise<ReportInstrument[]> {
  if (!rig) return [];
  const channels = setup?.channels ?? rig.channels;
  const jackId = setup ? (setup.jack?.instrumentId ?? null) : rig.jackInstrumentId;
  const ids = [...new Set([...channels.map((c) => c.instrumentId), jackId].filter((x): x is number => x != null))];
  const instruments = new Map((ids.length ? await Instrument.findAll({ where: { id: ids } }) : []).map((i) => [i.id, i]));
  const calibrations = ids.length ? await CalibrationRecord.findAll({ where: { instrumentId: ids }, order: [['calibratedOn', 'DESC']] }) : [];
  const used = (id: number) => {
    if (!setup) return calibrations.find((c) => c.instrumentId === id) ?? null;
    const version = setup.instruments.find((v) => v.instrumentId === id)?.calibrationId;
    return calibrations.find((c) => c.id === version) ?? null;
  };
  const line = (channel: string, role: string, id: number | null): ReportInstrument => {
    const i = id == null ? undefined : instruments.get(id);
    const c = id == null ? null : used(id);
    return {
      channel,
      role,
      instrument: i?.makeModel ?? null,
      serialNumber: i?.serialNumber ?? null,
      calibrationId: c?.id ?? null,
      calibratedOn: c?.calibratedOn ?? null,
      dueOn: c?.dueOn ?? null,
    };
  };
  const lines = channels.map((c) => line(c.label, c.role, c.instrumentId));
  if (jackId != null) lines.push(line('Jack', 'jack', jackId));
  return lines;
}

async function userNames(ids: (number | null)[]): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((x): x is number => x !== null))];
  return new Map((wanted.length ? await User.findAll({ where: { id: wanted } }) : []).map((u) => [u.id, u.name]));
}

/** Gathers the report of a run. 404 for an unknown run. */
export async function loadReportData(runId: number, dataDir: string): Promise<ReportData> {
  const run = await Run.findByPk(runId);
  if (!run) throw notFound('Run');
  const plan = await TestPlan.findByPk(run.planId);
  if (!plan) throw notFound('Test plan of the run');
  const location = await TestLocation.findByPk(plan.locationId);
  if (!location) throw notFound('Test location of the run');
  const project = await Project.findByPk(location.projectId);
  if (!project) throw notFound('Project of the run');
  const organization = await Organization.findByPk(project.organizationId);
  const rig = run.rigId === null ? null : await Rig.findByPk(run.rigId);
  const record = await loadRunRecord(runId);
  const signoff = await signoffView(runId);
  const saved = await Interpretation.findOne({
    where: { runId, ...(signoff.interpretationVersion !== null ? { version: signoff.interpretationVersion } : {}) },
    order: [['version', 'DESC']],
  });
  const events = await RunEvent.findAll({ where: { runId }, attributes: ['userId'] });
  const names = await userNames([run.createdBy, saved?.createdBy ?? null, ...events.map((e) => e.userId)]);
  const input = plan.toInput();
  const profile = findProfile(input.procedureId);
  const crew = [...new Set([run.createdBy, ...events.map((e) => e.userId)].flatMap((id) => (id !== null && names.has(id) ? [names.get(id)!] : [])))];
  return {
    runId,
    generatedAt: new Date(),
    project: { code: project.code, name: project.name, site: project.site, address: project.address },
    clientName: organization?.name ?? '',
    location: {
      pitId: location.pitId,
      latitude: location.latitude,
      longitude: location.longitude,
      planX: location.planX,
      planY: location.planY,
      testDepthM: location.testDepthM,
      waterTableDepthM: location.waterTableDepthM,
      pitWidthM: location.pitWidthM,
      soilDescription: location.soilDescription,
      notes: location.notes,
    },
    testDate: record.metadata?.testDate ?? run.startedAt?.toISOString().slice(0, 10) ?? null,
    crew,
    plan: { name: plan.name, input, profileName: profile?.name ?? null, profileFamily: profile?.family ?? null, sources: profile?.sources ?? [] },
    rigName: rig?.name ?? null,
    instruments: await instrumentsOf(rig, run.state.setup),
    record,
    analysis: saved ? (saved.result as unknown as RecordAnalysis) : analyzeRecord(record),
    interpretation: saved
      ? {
          version: saved.version,
          options: saved.options as Record<string, unknown>,
          chosenMethod: saved.chosenMethod,
          reason: saved.reason,
          byName: saved.createdBy === null ? null : (names.get(saved.createdBy) ?? null),
          savedAt: saved.createdAt,
        }
      : null,
    remarks: [
      ...(record.events ?? [])
        .filter((e) => e.kind === 'note')
        .map((e) => `Stage ${e.stage}${e.tMin === undefined ? '' : `, ${e.tMin.toFixed(1)} min`}: ${e.text}`),
      ...(input.notes ? [input.notes] : []),
    ],
    signoff,
    sitePlan: await sitePlanImage(dataDir, location.sitePlanFile ?? null),
    photos: await reportPhotos(dataDir, runId, location.id),
  };
}

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');
const imageSeal = (image: ReportImage) => ({ sha256: sha256(image.jpeg), width: image.width, height: image.height });

/**
 * What a signature seals: everything the report shows — project, client, location, plan, rig and the
 * calibrations in force, the record, the interpretation with its cautions, remarks, the site plan and the
 * photos (images by the SHA-256 of the bytes printed) — as plain JSON for canonical hashing. Left out: the
 * moment of printing and the sign-off block, which the signature itself fills in. `revision` is the one signed.
 */
export function sealedContent(d: ReportData, revision: number) {
  const { generatedAt: _printed, signoff: _signoff, sitePlan, photos, ...shown } = d;
  return {
    ...shown,
    revision,
    sitePlan: sitePlan && imageSeal(sitePlan),
    photos: photos.map(({ image, ...photo }) => ({ ...photo, image: imageSeal(image) })),
  };
}
export type SealedContent = ReturnType<typeof sealedContent>;
