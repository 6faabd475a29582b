export function SkipLink({ target = 'main' }: { target?: string }) {
  return (
    <a href={`#${target}`} className="sr-only z-50 rounded-md bg-white px-4 py-3 font-semibold text-ink-900 shadow-raised focus:not-sr-only focus:fixed focus:top-3 focus:left-3">
      Skip to main content
    </a>
  );
}
