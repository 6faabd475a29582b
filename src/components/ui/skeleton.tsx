interface SkeletonProps {
  className?: string;
}

export function Skeleton({ className = 'h-4 w-full' }: SkeletonProps) {
  return <span aria-hidden="true" className={`block animate-pulse rounded bg-ink-100 ${className}`} />;
}

interface SkeletonBlockProps {
  /** What is being loaded, read out instead of the grey bars. */
  label: string;
  lines?: number;
  className?: string;
}

/** A few grey bars standing in for content that is on its way. */
export function SkeletonBlock({ label, lines = 3, className = '' }: SkeletonBlockProps) {
  return (
    <div role="status" aria-live="polite" className={`space-y-3 ${className}`}>
      <span className="sr-only">{label}</span>
      {Array.from({ length: lines }, (_, index) => (
        <Skeleton key={index} className={`h-4 ${index === lines - 1 ? 'w-2/3' : 'w-full'}`} />
      ))}
    </div>
  );
}
