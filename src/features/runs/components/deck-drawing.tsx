import { useId } from 'react';
import type { KeyboardEvent } from 'react';
import type { Run } from '../../../../shared/schemas/run.schema';
import { deckLayout } from '../lib/deck-layout';
import { dropStyle } from '../lib/drop-style';
import { facesText, kg, metres, plural } from '../lib/run-format';
import { DropPatterns, patternId } from './drop-patterns';

const SIDE_MARGIN = 450;
const CAB = 1000;
const REAR = 650;

interface DeckDrawingProps {
  run: Run;
  /** Given, each pallet is a toggle button: tapping it ticks or unticks it loaded. */
  onToggle?: (index: number, loaded: boolean) => void;
  /** Positions whose tick is on its way to the server. */
  pending?: ReadonlySet<number>;
  className?: string;
}

/** Words for one position, shared by the drawing, the list and screen readers. */
export function positionName(run: Run, index: number): string {
  const p = run.deck.positions[index]!;
  const reference = run.drops.find((d) => d.order_id === p.order_id)?.reference ?? `order ${p.order_id}`;
  return `Pallet ${p.pallet} of ${reference}, drop ${p.drop}, row ${p.row} ${p.side}, ${kg(p.weight_kg)}`;
}

/** Short words for the pallet's first face, to print on it. */
function faceLabel(faces: Run['deck']['positions'][number]['faces']): string {
  if (faces.length === 0) return 'accessories';
  const first = faces[0]!.face;
  const text = faces.length > 1 ? `${first} +${faces.length - 1}` : first;
  return text.length > 14 ? `${text.slice(0, 13)}…` : text;
}

/**
 * The lorry's deck seen from above, to scale, the cab at the top: every pallet numbered with its drop
 * (D) and its number within its order (P), filled with its drop's pattern and colour, ticked once
 * loaded; left and right weights under the deck and the load's centre of gravity as a dashed line.
 */
export function DeckDrawing({ run, onToggle, pending, className = 'w-full max-w-[20rem]' }: DeckDrawingProps) {
  const prefix = useId().replace(/:/g, '');
  const titleId = `${prefix}-title`;
  const descId = `${prefix}-desc`;
  const layout = deckLayout(run);
  const { lengthMm: L, widthMm: W } = layout;
  // An overfull plan runs past the deck's end: the drawing grows to show it.
  const drawnLength = Math.max(L, layout.rows * layout.rowDepthMm);
  const positions = run.deck.positions;
  const drops = [...new Set(positions.map((p) => p.drop))].sort((a, b) => a - b);
  const loaded = positions.filter((p) => p.loaded).length;
  const cog = Math.min(Math.max(run.deck.cog_from_front_mm, 0), drawnLength);
  const interactive = Boolean(onToggle);
  const summary =
    `Deck ${metres(L)} long and ${metres(W)} wide, the cab at the top. ${plural(positions.length, 'pallet')} in ${plural(layout.rows, 'row')} of two, ` +
    `${loaded} loaded. Left ${kg(run.deck.left_kg)}, right ${kg(run.deck.right_kg)}; centre of gravity ${metres(run.deck.cog_from_front_mm)} from the front.`;

  const onKey = (event: KeyboardEvent<SVGGElement>, index: number, isLoaded: boolean) => {
    if (event.key === 'Enter' || event.key === ' ') {
      event.preventDefault();
      onToggle?.(index, !isLoaded);
    }
  };

  return (
    <svg
      viewBox={`${-SIDE_MARGIN} ${-CAB} ${W + 2 * SIDE_MARGIN} ${drawnLength + CAB + REAR}`}
      className={className}
      role={interactive ? 'group' : 'img'}
      aria-labelledby={titleId}
      aria-describedby={descId}
      data-testid="deck-drawing"
    >
      <title id={titleId}>{`Deck plan of ${run.lorry.registration}`}</title>
      <desc id={descId}>{summary}</desc>
      <DropPatterns prefix={prefix} drops={drops} />
      {/* The cab: the front of the deck. */}
      <rect x={150} y={-CAB + 80} width={W - 300} height={CAB - 230} rx={180} fill="#cdd4dd" stroke="#465263" strokeWidth={30} />
      <text x={W / 2} y={-CAB / 2 + 40} textAnchor="middle" fontSize={200} fontWeight={600} fill="#232b37">
        CAB · FRONT
      </text>
      <rect x={0} y={0} width={W} height={L} fill="#f7f4ef" stroke="#465263" strokeWidth={40} />
      {Array.from({ length: layout.rows }, (_, r) => (
        <text key={r} x={-SIDE_MARGIN / 2} y={(r + 0.5) * layout.rowDepthMm + 70} textAnchor="middle" fontSize={190} fill="#465263" aria-hidden="true">
          {r + 1}
        </text>
      ))}
      {layout.boxes.map((box) => {
        const p = positions[box.index]!;
        const style = dropStyle(p.drop);
        const busy = pending?.has(box.index) ?? false;
        const cx = box.x + box.width / 2;
        const label = `${positionName(run, box.index)}; ${facesText(p.faces)}`;
        return (
          <g
            key={box.index}
            data-testid="deck-pallet"
            data-drop={p.drop}
            data-loaded={p.loaded}
            {...(interactive
              ? {
                  role: 'button',
                  tabIndex: 0,
                  'aria-pressed': p.loaded,
                  'aria-label': `${positionName(run, box.index)}${p.loaded ? ', loaded' : ''}`,
                  'aria-busy': busy || undefined,
                  onClick: () => onToggle?.(box.index, !p.loaded),
                  onKeyDown: (e: KeyboardEvent<SVGGElement>) => onKey(e, box.index, p.loaded),
                  style: { cursor: 'pointer' },
                }
              : {})}
          >
            <title>{label}</title>
            <rect
              x={box.x}
              y={box.y}
              width={box.width}
              height={box.length}
              rx={40}
              fill={`url(#${patternId(prefix, p.drop)})`}
              stroke={p.loaded ? '#161c25' : style.colour}
              strokeWidth={p.loaded ? 70 : 40}
              opacity={busy ? 0.6 : 1}
            />
            <g fontFamily="inherit" textAnchor="middle" fill="#161c25" stroke="#ffffff" strokeWidth={36} paintOrder="stroke" strokeLinejoin="round">
              <text x={cx} y={box.y + box.length * 0.36} fontSize={Math.min(300, box.width * 0.3)} fontWeight={700}>
                D{p.drop}
              </text>
              <text x={cx} y={box.y + box.length * 0.62} fontSize={Math.min(210, box.width * 0.2)} fontWeight={600}>
                P{p.pallet} · {Math.round(p.weight_kg)}
              </text>
              <text x={cx} y={box.y + box.length * 0.85} fontSize={Math.min(140, box.width * 0.13)}>
                {faceLabel(p.faces)}
              </text>
            </g>
            {p.loaded ? (
              <g data-testid="deck-tick" aria-hidden="true">
                <circle cx={box.x + box.width - 170} cy={box.y + 170} r={140} fill="#3f6b3a" stroke="#ffffff" strokeWidth={30} />
                <path d={`M${box.x + box.width - 240} ${box.y + 170} l55 60 l110 -120`} fill="none" stroke="#ffffff" strokeWidth={45} strokeLinecap="round" strokeLinejoin="round" />
              </g>
            ) : null}
          </g>
        );
      })}
      {/* Centre of gravity along the deck. */}
      <g aria-hidden="true" data-testid="deck-cog">
        <line x1={-SIDE_MARGIN + 60} x2={W + SIDE_MARGIN - 60} y1={cog} y2={cog} stroke="#8f1e18" strokeWidth={40} strokeDasharray="120 80" />
        <path d={`M${W + SIDE_MARGIN - 40} ${cog} l-160 -110 v220 z`} fill="#8f1e18" />
        <path d={`M${-SIDE_MARGIN + 40} ${cog} l160 -110 v220 z`} fill="#8f1e18" />
      </g>
      <g fontSize={190} fill="#232b37" textAnchor="middle">
        <text x={W / 4} y={drawnLength + 260}>
          Left
        </text>
        <text x={W / 4} y={drawnLength + 500} fontWeight={700}>
          {kg(run.deck.left_kg)}
        </text>
        <text x={(3 * W) / 4} y={drawnLength + 260}>
          Right
        </text>
        <text x={(3 * W) / 4} y={drawnLength + 500} fontWeight={700}>
          {kg(run.deck.right_kg)}
        </text>
      </g>
    </svg>
  );
}
