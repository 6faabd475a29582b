import { Spinner } from './spinner';

/** Shown while the first page's guard asks the server who is signed in. */
export function PageLoading({ label = 'Loading Ridgeload' }: { label?: string }) {
  return (
    <div className="flex min-h-dvh items-center justify-center text-ink-600">
      <Spinner className="h-8 w-8" label={label} />
    </div>
  );
}
