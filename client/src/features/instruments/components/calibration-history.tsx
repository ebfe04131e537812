import type { Calibration, CalibrationCurve } from '@shared/calibration/schema';
import type { CalibrationRecord } from '@shared/schemas/instruments';
import { useId, useState } from 'react';
import { FormError } from '../../../components/form-alert';
import { EmptyState } from '../../../components/query-states';
import { certificateHref, useUploadCertificate } from '../api/save-calibration';

const CERTIFICATE_TYPES = ['application/pdf', 'image/png', 'image/jpeg'];
const MAX_CERTIFICATE_BYTES = 10 * 1024 * 1024;
const HEADINGS = ['Calibrated', 'Due', 'Curve', 'Certificate'];

/** Why a file cannot be a certificate, or null when it can; the server checks again. */
export function certificateProblem(file: File): string | null {
  if (!CERTIFICATE_TYPES.includes(file.type)) return `${file.name}: a certificate must be a PDF, PNG or JPEG file`;
  if (file.size > MAX_CERTIFICATE_BYTES) return `${file.name}: larger than 10 MB`;
  return null;
}

function describeCurve(curve: CalibrationCurve): string {
  switch (curve.kind) {
    case 'linear':
      return `y = ${curve.c0} + ${curve.c1}·x`;
    case 'polynomial':
      return `polynomial, ${curve.coefficients.length} coefficients`;
    case 'table':
      return `table, ${curve.points.length} points`;
  }
}

function describeMethod(method: Calibration): string {
  const falling = method.fallingCurve ? `; falling: ${describeCurve(method.fallingCurve)}` : '';
  return `${method.inputUnit} → ${method.outputUnit}: ${describeCurve(method.curve)}${falling}`;
}

function CertificateCell({ calibration, canUpload }: { calibration: CalibrationRecord; canUpload: boolean }) {
  const inputId = useId();
  const upload = useUploadCertificate();
  const [problem, setProblem] = useState<string | null>(null);
  const choose = (file: File | undefined) => {
    if (!file) return;
    const reason = certificateProblem(file);
    setProblem(reason);
    if (!reason) upload.mutate({ calibrationId: calibration.id, file });
  };
  return (
    <div className="flex flex-col gap-1">
      {calibration.certificateFile ? (
        <a href={certificateHref(calibration.id)} target="_blank" rel="noreferrer" className="font-semibold">
          View certificate
        </a>
      ) : (
        <span className="text-neutral-800">No certificate</span>
      )}
      {canUpload && (
        <label htmlFor={inputId} className="text-sm font-semibold">
          {calibration.certificateFile ? 'Replace certificate' : 'Attach certificate'} (PDF, PNG, JPEG, ≤ 10 MB)
          <input
            id={inputId}
            type="file"
            accept={CERTIFICATE_TYPES.join(',')}
            disabled={upload.isPending}
            className="mt-1 block min-h-touch w-full text-base font-normal"
            onChange={(e) => choose(e.target.files?.[0])}
          />
        </label>
      )}
      {upload.isPending && <span role="status">Uploading…</span>}
      <FormError message={problem ?? upload.error?.message} />
    </div>
  );
}

/** Every calibration of an instrument, newest first, with its certificate. */
export function CalibrationHistory({ calibrations, canUpload }: { calibrations: CalibrationRecord[]; canUpload: boolean }) {
  if (calibrations.length === 0) return <EmptyState title="No calibration recorded">Runs will flag this instrument until one is.</EmptyState>;
  return (
    <div className="overflow-x-auto rounded-md border-2 border-neutral-300">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">Calibration history</caption>
        <thead className="bg-neutral-100">
          <tr>
            {HEADINGS.map((heading) => (
              <th key={heading} scope="col" className="px-3 py-2">
                {heading}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {calibrations.map((c) => (
            <tr key={c.id} className="border-t border-neutral-300 align-top">
              <td className="px-3 py-2 font-mono whitespace-nowrap">{c.calibratedOn}</td>
              <td className="px-3 py-2 font-mono whitespace-nowrap">{c.dueOn}</td>
              <td className="px-3 py-2">
                <span className="font-mono">{describeMethod(c.method)}</span>
                {c.notes && <p className="text-sm whitespace-pre-line text-neutral-800">{c.notes}</p>}
              </td>
              <td className="px-3 py-2">
                <CertificateCell calibration={c} canUpload={canUpload} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
