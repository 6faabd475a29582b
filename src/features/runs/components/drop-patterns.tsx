import { dropStyle } from '../lib/drop-style';
import type { DropPatternKind } from '../lib/drop-style';

/** The id of drop `drop`'s fill pattern inside one drawing (ids are per drawing: a page may hold several). */
export const patternId = (prefix: string, drop: number) => `${prefix}-drop-${drop}`;

function marks(kind: DropPatternKind, colour: string) {
  const line = { stroke: colour, strokeWidth: 36 };
  switch (kind) {
    case 'diagonal':
      return <path d="M-50 50 L50 -50 M0 200 L200 0 M150 250 L250 150" {...line} />;
    case 'backslash':
      return <path d="M-50 150 L50 250 M0 0 L200 200 M150 -50 L250 50" {...line} />;
    case 'horizontal':
      return <path d="M0 50 H200 M0 150 H200" {...line} />;
    case 'vertical':
      return <path d="M50 0 V200 M150 0 V200" {...line} />;
    case 'crosshatch':
      return <path d="M0 100 H200 M100 0 V200" {...line} />;
    case 'dots':
      return (
        <g fill={colour}>
          <circle cx="50" cy="50" r="30" />
          <circle cx="150" cy="150" r="30" />
        </g>
      );
    case 'checks':
      return (
        <g fill={colour} fillOpacity={0.55}>
          <rect x="0" y="0" width="100" height="100" />
          <rect x="100" y="100" width="100" height="100" />
        </g>
      );
    case 'rings':
      return <circle cx="100" cy="100" r="55" fill="none" stroke={colour} strokeWidth="28" />;
  }
}

/** SVG fill patterns for drops 1…n, tiled every 200 mm of the drawing. */
export function DropPatterns({ prefix, drops }: { prefix: string; drops: readonly number[] }) {
  return (
    <defs>
      {drops.map((drop) => {
        const style = dropStyle(drop);
        return (
          <pattern key={drop} id={patternId(prefix, drop)} data-pattern={style.pattern} patternUnits="userSpaceOnUse" width="200" height="200">
            <rect width="200" height="200" fill={style.tint} />
            {marks(style.pattern, style.colour)}
          </pattern>
        );
      })}
    </defs>
  );
}

/** A small swatch of a drop's pattern, for legends and lists. */
export function DropSwatch({ drop, className = 'h-5 w-5' }: { drop: number; className?: string }) {
  const prefix = `swatch-${drop}`;
  const style = dropStyle(drop);
  return (
    <svg viewBox="0 0 400 400" className={`inline-block shrink-0 rounded-sm border border-ink-400 ${className}`} aria-hidden="true" focusable="false">
      <DropPatterns prefix={prefix} drops={[drop]} />
      <rect width="400" height="400" fill={`url(#${patternId(prefix, drop)})`} stroke={style.colour} strokeWidth="40" />
    </svg>
  );
}
