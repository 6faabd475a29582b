interface LogoMarkProps {
  className?: string;
  /** Colour of the ridge line; the courses follow the surrounding text colour. */
  ridgeColour?: string;
}

/**
 * Ridgeload's mark: a ridge line over three courses of tiles laid broken bond. Decorative,
 * so it is hidden from screen readers; the wordmark beside it carries the name.
 */
export function LogoMark({ className = 'h-9 w-9', ridgeColour = '#bd5a36' }: LogoMarkProps) {
  return (
    <svg viewBox="0 0 40 40" className={className} aria-hidden="true" focusable="false">
      <path d="M4 17.5 L20 5.5 L36 17.5" fill="none" stroke={ridgeColour} strokeWidth="3.5" strokeLinecap="round" strokeLinejoin="round" />
      <g fill="currentColor">
        <rect x="8" y="20.5" width="11" height="4" rx="1" />
        <rect x="21" y="20.5" width="11" height="4" rx="1" />
        <rect x="8" y="26.5" width="5" height="4" rx="1" />
        <rect x="15" y="26.5" width="10" height="4" rx="1" />
        <rect x="27" y="26.5" width="5" height="4" rx="1" />
        <rect x="8" y="32.5" width="11" height="4" rx="1" />
        <rect x="21" y="32.5" width="11" height="4" rx="1" />
      </g>
    </svg>
  );
}

interface WordmarkProps {
  className?: string;
  markClassName?: string;
  ridgeColour?: string;
}

export function Wordmark({ className = '', markClassName, ridgeColour }: WordmarkProps) {
  return (
    <span className={`inline-flex items-center gap-2 ${className}`}>
      <LogoMark className={markClassName} ridgeColour={ridgeColour} />
      <span className="text-xl font-semibold tracking-tight">Ridgeload</span>
    </span>
  );
}
