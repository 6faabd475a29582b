/**
 * Where a list's search bar goes while its code (the form library) arrives: the list itself shows at
 * once, and the bar takes its place without moving the list.
 */
export function SearchBarLoading({ label }: { label: string }) {
  return (
    <div className="flex min-h-[4.5rem] items-end" aria-busy="true">
      <p className="text-sm text-ink-600">{label}</p>
    </div>
  );
}
