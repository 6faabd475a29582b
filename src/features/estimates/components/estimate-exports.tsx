import { buttonClasses } from '../../../components/ui/button';
import { estimateExportUrls } from '../api/export-links';

/** Downloads of the bill and the per-face table; the server names the files and neutralises formula-like text. */
export function EstimateExports({ estimateId }: { estimateId: number }) {
  const urls = estimateExportUrls(estimateId);
  return (
    <div className="flex flex-wrap gap-2" role="group" aria-label="Download the estimate">
      <a href={urls.xlsx} download className={buttonClasses('secondary')}>
        Download .xlsx
      </a>
      <a href={urls.billCsv} download className={buttonClasses('secondary')}>
        Bill as CSV
      </a>
      <a href={urls.facesCsv} download className={buttonClasses('secondary')}>
        Faces as CSV
      </a>
    </div>
  );
}
