import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { MailboxMessage } from '../../../client/src/features/mailbox/api/get-mailbox';
import { MailboxList } from '../../../client/src/features/mailbox/components/mailbox-list';
import type { ReportListItem } from '../../../client/src/features/reports/api/get-reports';
import { ReportsList } from '../../../client/src/features/reports/components/reports-list';
import { stubFetch } from '../support/fetch-stub';
import { renderWithProviders } from '../support/render';

// Invented client, project and message.
const REPORT: ReportListItem = {
  runId: 41,
  projectId: 5,
  projectCode: 'WR-22',
  projectName: 'Wrenfield yard',
  organizationName: 'Wrenfield Haulage',
  pitId: 'TP-2',
  planName: 'Bearing test TP-2',
  testDate: '2026-11-20',
  revision: 2,
  signedAt: '2026-11-28T08:00:00.000Z',
};

const MESSAGE: MailboxMessage = {
  id: 3,
  receivedAt: '2026-11-28T08:05:00.000Z',
  from: 'reports@settlescope.local',
  to: ['yard@wrenfield.example'],
  subject: 'Plate load test report: WR-22, pit TP-2 (revision 2)',
  text: 'Attached is the signed report.',
  attachments: [
    { fileName: 'run-41-report-rev2.pdf', contentType: 'application/pdf', sizeBytes: 51_200 },
    { fileName: 'run-41-readings.csv', contentType: 'text/csv', sizeBytes: 2048 },
  ],
  sizeBytes: 80_000,
};

describe('reports list', () => {
  it('gives a client the PDF and CSV of each signed report, without the staff columns', () => {
    stubFetch({});
    renderWithProviders(<ReportsList reports={[REPORT]} showClient={false} />);
    expect(screen.getByRole('link', { name: 'Report (PDF)' }).getAttribute('href')).toBe('/api/runs/41/report.pdf');
    expect(screen.getByRole('link', { name: 'Readings (CSV)' }).getAttribute('href')).toBe('/api/reports/41/readings.csv');
    expect(screen.getByRole('link', { name: 'Signed data (JSON)' }).getAttribute('href')).toBe('/api/reports/41/signed-data.json');
    expect(screen.queryByText('Wrenfield Haulage')).toBeNull();
    expect(screen.queryByRole('link', { name: 'Sign-off' })).toBeNull();
  });

  it('shows staff the client and a link to the sign-off page', () => {
    stubFetch({});
    renderWithProviders(<ReportsList reports={[REPORT]} showClient />);
    expect(screen.getByText('Wrenfield Haulage')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Sign-off' }).getAttribute('href')).toBe('/runs/41/signoff');
  });
});

describe('mailbox', () => {
  it('lists each message with its recipients, text and attachment sizes', async () => {
    stubFetch({});
    const { user } = renderWithProviders(<MailboxList messages={[MESSAGE]} />);
    await user.click(screen.getByText(MESSAGE.subject));
    expect(screen.getByText(/yard@wrenfield\.example/)).toBeTruthy();
    expect(screen.getByText('Attached is the signed report.')).toBeTruthy();
    expect(screen.getByText('run-41-report-rev2.pdf').parentElement?.textContent).toBe('run-41-report-rev2.pdf (application/pdf, 50.0 kB)');
  });

  it('says so when nothing has arrived', () => {
    stubFetch({});
    renderWithProviders(<MailboxList messages={[]} />);
    expect(screen.getByText('No mail yet')).toBeTruthy();
  });
});
