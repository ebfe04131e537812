import { recordToReadingsCsv } from '../../shared/records/csv';
import { idParams } from '../../shared/schemas/common';
import { EVERYONE } from '../auth/permissions';
import { notFound } from '../http/errors';
import { route } from '../http/route';
import { listReports, reportRunFor } from '../services/report-access';
import { loadReportData } from '../services/report-data';
import { renderReportPdf } from '../services/report-pdf';
import { loadRunRecord } from '../services/run-record';
import { sealedReport } from '../services/signoff';

interface ReportFile {
  name: string;
  type: string;
  body: Buffer | string;
}

/** A download of a reported run, for those who may see its report (clients: signed runs of their organisation only, else 404). */
const reportFileRoute = (path: string, summary: string, file: (runId: number) => Promise<ReportFile>) =>
  route({
    method: 'get',
    path,
    access: EVERYONE,
    summary,
    params: idParams,
    handler: async ({ params, user, res }) => {
      await reportRunFor(user!, params.id);
      const { name, type, body } = await file(params.id);
      res.type(type).attachment(name).send(body);
    },
  });

/** Signed reports and their downloads; the PDF's photos and site plan are read from `dataDir`. */
export const reportRoutes = (dataDir: string) => [
  route({
    method: 'get',
    path: '/api/reports',
    access: EVERYONE,
    summary: 'Signed reports: a client’s own organisation’s, or every signed run for staff',
    handler: async ({ user }) => ({ items: await listReports(user!) }),
  }),
  // A signed run's PDF and readings are the sealed ones, exactly as signed; others are rendered from today's data.
  reportFileRoute('/api/runs/:id/report.pdf', 'The PDF report of a run: the sealed one once signed (clients: signed runs of their organisation only)', async (id) => ({
    name: `run-${id}-report.pdf`,
    type: 'application/pdf',
    body: (await sealedReport(id))?.pdf ?? (await renderReportPdf(await loadReportData(id, dataDir))),
  })),
  reportFileRoute('/api/reports/:id/readings.csv', 'Every reading of a reported run as CSV: the signed record once signed (clients: signed runs of their organisation only)', async (id) => ({
    name: `run-${id}-readings.csv`,
    type: 'text/csv',
    body: recordToReadingsCsv((await sealedReport(id))?.record ?? (await loadRunRecord(id))),
  })),
  // What a signature's hash covers, for anyone to check: SHA-256 of this file's RFC 8785 canonical form.
  reportFileRoute('/api/reports/:id/signed-data.json', 'The signed data of a signed run as sealed (its SHA-256 is the signature’s hash; clients: their organisation’s only)', async (id) => {
    const sealed = await sealedReport(id);
    if (!sealed) throw notFound(`A signed report of run ${id}`);
    return { name: `run-${id}-signed-data-rev${sealed.revision}.json`, type: 'application/json', body: sealed.snapshot };
  }),
];
