import { buttonClasses } from '../../../components/ui/button';
import { runDocuments } from '../api/documents';

/** The run's paperwork: each opens its PDF in a new tab, ready to print. */
export function PrintLinks({ runId, hasDrops }: { runId: number; hasDrops: boolean }) {
  if (!hasDrops) return null;
  return (
    <div className="flex flex-wrap gap-2" role="group" aria-label="Print">
      <a href={runDocuments.loadingSheet(runId)} target="_blank" rel="noopener" className={buttonClasses('secondary')}>
        Loading sheet (PDF)
      </a>
      <a href={runDocuments.labels(runId)} target="_blank" rel="noopener" className={buttonClasses('secondary')}>
        Pallet labels (PDF)
      </a>
    </div>
  );
}
