import path from 'node:path';
import { idParams } from '../../shared/schemas/common';
import { calibrationRecordInput, instrumentInput, instrumentPatch } from '../../shared/schemas/instruments';
import { calibrationRecorded } from '../acquisition/calibration-events';
import { EDITORS, STAFF } from '../auth/permissions';
import { notFound } from '../http/errors';
import { patched } from '../http/patch';
import { route } from '../http/route';
import { sendStoredFile, singleUpload, storeUpload, uploadDir } from '../http/uploads';
import { CalibrationRecord } from '../models/calibration-record';
import { Instrument } from '../models/instrument';
import { audited } from '../services/audit';

const CERTIFICATE_TYPES = ['application/pdf', 'image/png', 'image/jpeg'] as const;
const withCalibrations = { include: [{ model: CalibrationRecord, as: 'calibrations' }] };

async function loadInstrument(id: number): Promise<Instrument> {
  const instrument = await Instrument.findByPk(id, withCalibrations);
  if (!instrument) throw notFound('Instrument');
  return instrument;
}

async function loadCalibration(id: number): Promise<CalibrationRecord> {
  const calibration = await CalibrationRecord.findByPk(id);
  if (!calibration) throw notFound('Calibration');
  return calibration;
}

/** The instrument register: gauges, transducers, jacks and load cells with their calibrations. */
export const instrumentRoutes = (dataDir: string) => {
  const certificates = uploadDir(dataDir, 'certificates');
  return [
    route({
      method: 'get',
      path: '/api/instruments',
      access: STAFF,
      summary: 'The instrument register with calibration status',
      handler: async () => ({ items: (await Instrument.findAll({ ...withCalibrations, order: [['kind', 'ASC'], ['serialNumber', 'ASC']] })).map((i) => i.toDto()) }),
    }),
    route({
      method: 'post',
      path: '/api/instruments',
      access: EDITORS,
      summary: 'Register an instrument',
      body: instrumentInput,
      handler: async ({ body, user }) => {
        const created = await audited(
          (transaction) => Instrument.create(body, { transaction }),
          (i) => ({ userId: user!.id, entity: 'instrument', entityId: i.id, action: 'created', after: i.get({ plain: true }) }),
        );
        return (await loadInstrument(created.id)).toDto();
      },
    }),
    route({
      method: 'get',
      path: '/api/instruments/:id',
      access: STAFF,
      summary: 'One instrument with all its calibrations',
      params: idParams,
      handler: async ({ params }) => {
        const instrument = await loadInstrument(params.id);
        const history = [...(instrument.calibrations ?? [])].sort((a, b) => b.calibratedOn.localeCompare(a.calibratedOn));
        return { ...instrument.toDto(), calibrations: history.map((c) => c.toDto()) };
      },
    }),
    route({
      method: 'patch',
      path: '/api/instruments/:id',
      access: EDITORS,
      summary: 'Change an instrument (the fields sent; the others keep their values)',
      params: idParams,
      body: instrumentPatch,
      handler: async ({ params, body, user }) => {
        const instrument = await loadInstrument(params.id);
        const next = patched(instrumentInput, instrument.toDto(), body);
        const before = instrument.get({ plain: true });
        await audited(
          (transaction) => instrument.update(next, { transaction }),
          () => ({ userId: user!.id, entity: 'instrument', entityId: instrument.id, action: 'updated', before, after: instrument.get({ plain: true }) }),
        );
        return (await loadInstrument(instrument.id)).toDto();
      },
    }),
    route({
      method: 'post',
      path: '/api/instruments/:id/calibrations',
      access: EDITORS,
      summary: 'Record a calibration of an instrument',
      params: idParams,
      body: calibrationRecordInput,
      handler: async ({ params, body, user }) => {
        await loadInstrument(params.id);
        const created = await audited(
          (transaction) => CalibrationRecord.create({ ...body, instrumentId: params.id, createdBy: user!.id }, { transaction }),
          (c) => ({ userId: user!.id, entity: 'calibration', entityId: c.id, action: 'created', after: c.toDto() }),
        );
        calibrationRecorded(params.id); // a run using the instrument applies it from now on
        return created.toDto();
      },
    }),
    route({
      method: 'post',
      path: '/api/calibrations/:id/certificate',
      access: EDITORS,
      summary: 'Attach the certificate of a calibration (PDF, PNG or JPEG, ≤ 10 MB)',
      status: 200,
      params: idParams,
      before: [singleUpload('file', 10 * 1024 * 1024)],
      handler: async ({ params, req, user }) => {
        const calibration = await loadCalibration(params.id);
        const name = await storeUpload(req.file, certificates, CERTIFICATE_TYPES);
        const before = calibration.toDto();
        await audited(
          (transaction) => calibration.update({ certificateFile: name }, { transaction }),
          () => ({ userId: user!.id, entity: 'calibration', entityId: calibration.id, action: 'certificate-attached', before, after: calibration.toDto() }),
        );
        return calibration.toDto();
      },
    }),
    route({
      method: 'get',
      path: '/api/calibrations/:id/certificate',
      access: STAFF,
      summary: 'The certificate of a calibration',
      params: idParams,
      handler: async ({ params, res }) => {
        const calibration = await loadCalibration(params.id);
        const file = calibration.certificateFile;
        if (!file) throw notFound('Certificate');
        // A PDF is downloaded, never shown in the app's own origin (a PDF can carry script and open actions); images show inline.
        const disposition = path.extname(file).toLowerCase() === '.pdf' ? 'attachment' : 'inline';
        res.setHeader('Content-Disposition', `${disposition}; filename="calibration-${calibration.id}${path.extname(file)}"`);
        await sendStoredFile(res, certificates, file);
      },
    }),
  ];
};
