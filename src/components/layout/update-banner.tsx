import { useAppUpdate } from '../../lib/app-update';
import { Button } from '../ui/button';

/** Offers the new build of the app when one is ready; the person picks the moment. */
export function UpdateBanner() {
  const apply = useAppUpdate();
  if (!apply) return null;
  return (
    <div role="status" className="fixed inset-x-0 bottom-0 z-50 flex flex-wrap items-center justify-between gap-3 border-t-2 border-ink-700 bg-white p-4 text-lg shadow-raised">
      <span>A new version of Ridgeload is ready.</span>
      <Button size="lg" onClick={apply}>
        Reload now
      </Button>
    </div>
  );
}
