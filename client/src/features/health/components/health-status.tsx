import { useHealth } from '../api/get-health';

/**
 * Says nothing while all is well (colour and words are kept for abnormal states); says plainly
 * when the server or its database cannot be reached.
 */
export function HealthStatus() {
  const health = useHealth();
  const problem = health.isError
    ? 'The server cannot be reached. Changes will not be saved until it is back.'
    : health.data?.database === 'down'
      ? 'The database is down. Changes will not be saved until it is back.'
      : null;
  if (!problem) return null;
  return (
    <div role="alert" className="border-b-4 border-alarm-700 bg-alarm-50 px-4 py-2 font-semibold text-alarm-900">
      <span aria-hidden="true">✖ </span>
      {problem}
    </div>
  );
}
