import type { CalibrationRecord } from '@shared/schemas/instruments';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { CalibrationHistory } from '../../../client/src/features/instruments/components/calibration-history';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { renderWithProviders } from '../support/render';
import { GAUGE_OVERDUE, GAUGE_SOON } from './fixtures';

const WITHOUT = GAUGE_SOON.current as CalibrationRecord;
const WITH = { ...(GAUGE_OVERDUE.current as CalibrationRecord), certificateFile: 'c-20.pdf' };

describe('calibration history', () => {
  it('links a stored certificate and offers an upload for one that is missing', () => {
    stubFetch({});
    renderWithProviders(<CalibrationHistory calibrations={[WITHOUT, WITH]} canUpload />);
    expect(screen.getByRole('link', { name: 'View certificate' }).getAttribute('href')).toBe(`/api/calibrations/${WITH.id}/certificate`);
    expect(screen.getByText('No certificate')).toBeTruthy();
    expect(screen.getByLabelText(/Attach certificate/)).toBeTruthy();
    expect(screen.getByLabelText(/Replace certificate/)).toBeTruthy();
  });

  it('refuses a file that is not a PDF or image before sending it', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<CalibrationHistory calibrations={[WITHOUT]} canUpload />);
    // The picker's type filter is only a hint: a user can choose "all files" and pick anything.
    const user = userEvent.setup({ applyAccept: false });
    await user.upload(screen.getByLabelText(/Attach certificate/), new File(['x'], 'readings.csv', { type: 'text/csv' }));
    expect(screen.getByRole('alert').textContent).toContain('readings.csv: a certificate must be a PDF, PNG or JPEG file');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('uploads a PDF as the multipart field "file"', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      [`POST /api/calibrations/${WITHOUT.id}/certificate`]: json(200, { ...WITHOUT, certificateFile: 'new.pdf' }),
    });
    const { user } = renderWithProviders(<CalibrationHistory calibrations={[WITHOUT]} canUpload />);
    const pdf = new File(['%PDF-1.7'], 'certificate.pdf', { type: 'application/pdf' });
    await user.upload(screen.getByLabelText(/Attach certificate/), pdf);
    await vi.waitFor(() => expect(requests(fetchMock).some((r) => r.key === `POST /api/calibrations/${WITHOUT.id}/certificate`)).toBe(true));
    const body = requests(fetchMock).find((r) => r.key.startsWith('POST'))?.body as FormData;
    expect(body.get('file')).toBe(pdf);
  });

  it('offers no upload to a user who cannot change the register', () => {
    stubFetch({});
    renderWithProviders(<CalibrationHistory calibrations={[WITHOUT]} canUpload={false} />);
    expect(screen.queryByLabelText(/Attach certificate/)).toBeNull();
  });
});
