/**
 * Demo data: an invented consultancy's plate-testing crew and three invented client jobs.
 * Seeded once into an empty database; real data is never touched.
 */
import { findProfile } from '../../shared/procedures/profiles';
import type { PlanInput } from '../../shared/schemas/plans';
import type { Role } from '../../shared/schemas/users';
import { hashPassword } from '../auth/passwords';
import { transaction } from '../db/transaction';
import { CalibrationRecord } from '../models/calibration-record';
import { Instrument } from '../models/instrument';
import { Organization } from '../models/organization';
import { Project } from '../models/project';
import { TestLocation } from '../models/test-location';
import { TestPlan, planColumns } from '../models/test-plan';
import { User } from '../models/user';

export const DEMO_PASSWORD = 'settle-demo-2026';

export const DEMO_USERS: { email: string; name: string; role: Role; org?: string }[] = [
  { email: 'admin@settlescope.example', name: 'Rowan Pike (lab manager)', role: 'admin' },
  { email: 'engineer@settlescope.example', name: 'Ilse Varga (geotechnical engineer)', role: 'engineer' },
  { email: 'operator@settlescope.example', name: 'Tamsin Okafor (rig operator)', role: 'operator' },
  { email: 'client@harrowgate.example', name: 'Mateo Lindqvist (Harrowgate Freight)', role: 'client', org: 'Harrowgate Freight Ltd' },
];

function planFrom(profileId: string, name: string, overrides: Partial<PlanInput>): PlanInput {
  const profile = findProfile(profileId);
  if (!profile) throw new Error(`unknown profile ${profileId}`);
  return {
    name,
    procedureId: profileId,
    ...structuredClone(profile.defaults),
    apparatusWeightKn: 0.6,
    reaction: { kind: 'kentledge', capacityKn: 400, description: '' },
    footing: null,
    notes: '',
    ...overrides,
  };
}

export async function seedDemo(): Promise<boolean> {
  if ((await User.count()) > 0) return false;
  const hash = await hashPassword(DEMO_PASSWORD);
  await transaction(async (t) => {
    const orgs = new Map<string, Organization>();
    for (const [name, contacts] of [
      ['Harrowgate Freight Ltd', ['projects@harrowgate.example']],
      ['Fenwick Moor District Council', ['highways@fenwickmoor.example']],
      ['Eastmere Water Co-operative', ['works@eastmere.example']],
    ] as const) {
      orgs.set(name, await Organization.create({ name, contactEmails: [...contacts] }, { transaction: t }));
    }
    for (const u of DEMO_USERS) {
      await User.create(
        { email: u.email, name: u.name, role: u.role, organizationId: u.org ? orgs.get(u.org)!.id : null, passwordHash: hash, lastLoginAt: null },
        { transaction: t },
      );
    }

    await seedInstruments(t);

    const kestrel = await Project.create(
      {
        code: 'KQ-DC2',
        name: 'Kestrel Quay distribution centre, phase 2',
        organizationId: orgs.get('Harrowgate Freight Ltd')!.id,
        site: 'Kestrel Quay, Brackwater',
        address: 'Plot 7, Quayside Road, Brackwater',
        notes: 'Pad footings 2.0 m square at 1.5 m depth; column loads up to 1,400 kN.',
      },
      { transaction: t },
    );
    const pit1 = await TestLocation.create(
      {
        projectId: kestrel.id,
        pitId: 'PLT-01',
        latitude: 52.4312,
        longitude: 1.7021,
        planX: 0.32,
        planY: 0.41,
        testDepthM: 1.5,
        waterTableDepthM: 4.2,
        pitWidthM: 2.4,
        soilDescription: 'Medium dense brown fine to coarse SAND with some gravel',
        notes: '',
      },
      { transaction: t },
    );
    const pit2 = await TestLocation.create(
      {
        projectId: kestrel.id,
        pitId: 'PLT-02',
        latitude: 52.4318,
        longitude: 1.7033,
        planX: 0.68,
        planY: 0.55,
        testDepthM: 1.5,
        waterTableDepthM: 3.9,
        pitWidthM: 1.8,
        soilDescription: 'Loose to medium dense silty SAND',
        notes: 'Pit narrowed by a drain run on the east side.',
      },
      { transaction: t },
    );
    const sandPlan = (locationId: number) =>
      TestPlan.create(
        {
          locationId,
          ...planColumns(
            planFrom('bearing-granular', 'Bearing test at pad footing level', {
              footing: { shape: 'square', widthM: 2, lengthM: null, soilBehaviour: 'cohesionless' },
            }),
          ),
        },
        { transaction: t },
      );
    await sandPlan(pit1.id);
    await sandPlan(pit2.id);
    // A pit set up for the simulated rig (a 300 mm plate, as the simulator's grounds are quoted for).
    const demoPit = await TestLocation.create(
      {
        projectId: kestrel.id,
        pitId: 'PLT-03',
        latitude: null,
        longitude: null,
        planX: 0.5,
        planY: 0.7,
        testDepthM: 1.5,
        waterTableDepthM: 4.0,
        pitWidthM: 1.6,
        soilDescription: 'Dense brown sandy GRAVEL (demo pit for the simulated rig)',
        notes: '',
      },
      { transaction: t },
    );
    await TestPlan.create(
      {
        locationId: demoPit.id,
        ...planColumns(
          planFrom('bearing-granular', 'Bearing test, 300 mm plate (simulated rig)', {
            plate: { shape: 'circular', sizeMm: 300, thicknessMm: 25 },
            apparatusWeightKn: 0.5,
            loading: { mode: 'list', pressuresKpa: [100, 200, 300, 400, 500, 600, 700] },
            holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 5, minHoldMin: 10 },
            reaction: { kind: 'kentledge', capacityKn: 100, description: '10 t of concrete blocks on timber mats' },
            footing: { shape: 'square', widthM: 2, lengthM: null, soilBehaviour: 'cohesionless' },
          }),
        ),
      },
      { transaction: t },
    );

    const fenwick = await Project.create(
      {
        code: 'FM-AR7',
        name: 'Fenwick Moor access road, chainage 0–1,200',
        organizationId: orgs.get('Fenwick Moor District Council')!.id,
        site: 'Fenwick Moor',
        address: 'Moor Lane, Fenwick',
        notes: 'Formation and capping checks before the sub-base.',
      },
      { transaction: t },
    );
    const ch = await TestLocation.create(
      {
        projectId: fenwick.id,
        pitId: 'CH-0450',
        latitude: null,
        longitude: null,
        planX: null,
        planY: null,
        testDepthM: 0.6,
        waterTableDepthM: null,
        pitWidthM: null,
        soilDescription: 'Compacted crushed-rock capping on firm sandy CLAY',
        notes: '',
      },
      { transaction: t },
    );
    await TestPlan.create(
      {
        locationId: ch.id,
        ...planColumns(
          planFrom('modulus-two-cycle', 'Capping layer Ev2 check', { reaction: { kind: 'vehicle', capacityKn: 90, description: 'Loaded tipper, rear axle' } }),
        ),
      },
      { transaction: t },
    );
    await TestPlan.create(
      {
        locationId: ch.id,
        ...planColumns(
          planFrom('pavement-single', 'Formation k-value (762 mm plate)', {
            reaction: { kind: 'vehicle', capacityKn: 150, description: 'Loaded tipper, rear axle' },
          }),
        ),
      },
      { transaction: t },
    );

    const eastmere = await Project.create(
      {
        code: 'EM-PS3',
        name: 'Saltmarsh Vale pumping station',
        organizationId: orgs.get('Eastmere Water Co-operative')!.id,
        site: 'Saltmarsh Vale',
        address: 'Vale End, Eastmere',
        notes: 'Raft on soft estuarine clay; long holds expected.',
      },
      { transaction: t },
    );
    const clayPit = await TestLocation.create(
      {
        projectId: eastmere.id,
        pitId: 'TP-3',
        latitude: 52.1107,
        longitude: 1.5904,
        planX: 0.5,
        planY: 0.5,
        testDepthM: 1.2,
        waterTableDepthM: 1.6,
        pitWidthM: 3.0,
        soilDescription: 'Soft to firm grey silty CLAY',
        notes: '',
      },
      { transaction: t },
    );
    await TestPlan.create(
      {
        locationId: clayPit.id,
        ...planColumns(
          planFrom('bearing-cohesive', 'Bearing test on clay (24 h holds)', {
            footing: { shape: 'rectangular', widthM: 8, lengthM: 14, soilBehaviour: 'cohesive' },
          }),
        ),
      },
      { transaction: t },
    );
  });
  return true;
}

const daysFromToday = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

/** The lab's kit: four digital gauges (one overdue), an oil-pressure transducer and two jacks. */
async function seedInstruments(t: import('sequelize').Transaction) {
  const kit = [
    {
      kind: 'gauge',
      makeModel: 'Digital indicator 25 mm',
      serialNumber: 'DG-2107',
      unit: 'mm',
      rangeMin: 0,
      rangeMax: 25,
      resolution: 0.001,
      travelMm: 25,
      ratedPressureMpa: null,
      dueIn: 140,
    },
    {
      kind: 'gauge',
      makeModel: 'Digital indicator 25 mm',
      serialNumber: 'DG-2108',
      unit: 'mm',
      rangeMin: 0,
      rangeMax: 25,
      resolution: 0.001,
      travelMm: 25,
      ratedPressureMpa: null,
      dueIn: 140,
    },
    {
      kind: 'gauge',
      makeModel: 'Digital indicator 50 mm',
      serialNumber: 'DG-1733',
      unit: 'mm',
      rangeMin: 0,
      rangeMax: 50,
      resolution: 0.01,
      travelMm: 50,
      ratedPressureMpa: null,
      dueIn: 21,
    },
    {
      kind: 'gauge',
      makeModel: 'Dial gauge 50 mm',
      serialNumber: 'DL-0412',
      unit: 'mm',
      rangeMin: 0,
      rangeMax: 50,
      resolution: 0.01,
      travelMm: 50,
      ratedPressureMpa: null,
      dueIn: -12,
    },
    {
      kind: 'pressure',
      makeModel: 'Oil-pressure transducer 700 bar',
      serialNumber: 'PT-5520',
      unit: 'bar',
      rangeMin: 0,
      rangeMax: 700,
      resolution: 0.1,
      travelMm: null,
      ratedPressureMpa: null,
      dueIn: 95,
    },
    {
      kind: 'jack',
      makeModel: 'Single-acting jack 50 cm² ram',
      serialNumber: 'JK-50-031',
      unit: 'kN',
      rangeMin: 0,
      rangeMax: 350,
      resolution: null,
      travelMm: null,
      ratedPressureMpa: 70,
      dueIn: 160,
    },
    {
      kind: 'jack',
      makeModel: 'Compact jack 22.9 cm² ram',
      serialNumber: 'JK-23-007',
      unit: 'kN',
      rangeMin: 0,
      rangeMax: 150,
      resolution: null,
      travelMm: null,
      ratedPressureMpa: 70,
      dueIn: 60,
    },
  ] as const;
  for (const { dueIn, ...fields } of kit) {
    const instrument = await Instrument.create({ ...fields, notes: '' }, { transaction: t });
    // Gauges: reading = displacement; transducer: bar in = bar out; jacks: oil pressure (MPa) → force (kN).
    const method =
      fields.kind === 'jack'
        ? {
            inputUnit: 'MPa' as const,
            outputUnit: 'kN' as const,
            range: [0, 70] as [number, number],
            ...(fields.serialNumber === 'JK-50-031'
              ? // Seal friction: the same oil pressure gives ~3 % more force while unloading.
                { curve: { kind: 'linear' as const, c0: 0, c1: 4.926 }, fallingCurve: { kind: 'linear' as const, c0: 0, c1: 5.077 } }
              : { curve: { kind: 'linear' as const, c0: 0.1, c1: 2.27 } }),
          }
        : fields.kind === 'pressure'
          ? { inputUnit: 'bar' as const, outputUnit: 'bar' as const, curve: { kind: 'linear' as const, c0: 0, c1: 1.0 }, range: [0, 700] as [number, number] }
          : { inputUnit: 'mm' as const, outputUnit: 'mm' as const, curve: { kind: 'linear' as const, c0: 0, c1: 1.0 }, range: [0, fields.travelMm ?? 25] as [number, number] };
    await CalibrationRecord.create(
      {
        instrumentId: instrument.id,
        calibratedOn: daysFromToday(dueIn - 182),
        dueOn: daysFromToday(dueIn),
        method,
        notes: 'Demo certificate',
        createdBy: null,
      },
      { transaction: t },
    );
  }
}
