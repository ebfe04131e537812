import { buttonClass } from '../../../components/button';
import { runDownloads } from '../interpretation-paths';

/** Links to the run's record and CSV exports (the browser saves them as files). */
export function Downloads({ runId }: { runId: number }) {
  const files = runDownloads(runId);
  return (
    <nav aria-label="Downloads" className="flex flex-wrap gap-3">
      <a className={buttonClass('secondary')} href={files.recordJson} download>
        Record (JSON)
      </a>
      <a className={buttonClass('secondary')} href={files.readingsCsv} download>
        Readings (CSV)
      </a>
      <a className={buttonClass('secondary')} href={files.stagePointsCsv} download>
        Stage points (CSV)
      </a>
    </nav>
  );
}
