import type { DeviceProfile, ProfilePreview } from '@shared/devices/schema';
import { useState } from 'react';
import { Button } from '../../../components/button';
import { FormError } from '../../../components/form-alert';
import { TextField } from '../../../components/form-field';
import { usePreviewProfile } from '../api/preview-profile';
import { SAMPLE_WORDS } from '../utils/live-format';
import { StateWord } from './state-word';

/**
 * "Try it on this port": reads a port with the profile being edited for a moment and lists each
 * sample with its value or the reason it has none. `current` gives the profile as the form holds it
 * now, or the reason it cannot be tried yet.
 */
export function ProfilePreviewPanel({ current }: { current: () => { profile: DeviceProfile } | { problem: string } }) {
  const [port, setPort] = useState('');
  const [problem, setProblem] = useState<string | undefined>();
  const preview = usePreviewProfile();

  const tryIt = async () => {
    setProblem(undefined);
    const now = current();
    if ('problem' in now) return setProblem(now.problem);
    if (!port.trim()) return setProblem('Give the serial port to try, e.g. /dev/ttyUSB0.');
    try {
      await preview.mutateAsync({ profile: now.profile, port: port.trim() });
    } catch (error) {
      setProblem(error instanceof Error ? error.message : 'The request failed.');
    }
  };

  return (
    <section aria-labelledby="profile-preview" className="flex flex-col gap-3 rounded-md border-2 border-neutral-300 p-4">
      <h2 id="profile-preview" className="text-lg font-bold">
        Try it on a port
      </h2>
      <p className="text-sm text-neutral-800">
        Reads the port with these settings for a moment; nothing is saved. A port a rig check or a run is reading stays locked to it.
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <TextField label="Port to try" mono className="min-w-64" value={port} onChange={(e) => setPort(e.target.value)} />
        <Button variant="secondary" busy={preview.isPending} busyLabel="Reading…" onClick={tryIt}>
          Try it
        </Button>
      </div>
      <FormError message={problem} />
      {preview.data && !preview.isPending && <PreviewResult result={preview.data} />}
    </section>
  );
}

function PreviewResult({ result }: { result: ProfilePreview }) {
  if (!result.opened) {
    return (
      <p role="alert" className="font-semibold text-alarm-900">
        {result.problem}
      </p>
    );
  }
  if (result.samples.length === 0) return <p role="status">The port opened but no sample came within the time.</p>;
  const good = result.samples.filter((s) => s.status === 'ok').length;
  return (
    <div className="flex flex-col gap-2">
      <p role="status" className="font-semibold">
        {good} of {result.samples.length} samples good on <span className="font-mono">{result.port}</span>
      </p>
      <table className="text-left">
        <caption className="sr-only">Samples read</caption>
        <thead>
          <tr>
            <th className="pr-4">#</th>
            <th className="pr-4">Sample</th>
            <th className="pr-4">Value</th>
            <th className="pr-4">Raw</th>
            <th>Why</th>
          </tr>
        </thead>
        <tbody>
          {result.samples.map((s) => (
            <tr key={s.seq}>
              <td className="pr-4 font-mono">{s.seq}</td>
              <td className="pr-4">
                <StateWord {...SAMPLE_WORDS[s.status]} />
              </td>
              <td className="pr-4 font-mono">{s.value ?? '—'}</td>
              <td className="pr-4 font-mono break-all">{s.raw || '—'}</td>
              <td>{s.problem ?? ''}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
