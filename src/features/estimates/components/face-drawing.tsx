import { useId, useMemo } from 'react';
import type { ReactNode } from 'react';
import type { FaceShape } from '../../../../shared/engine/geometry';
import type { FaceResult } from '../../../../shared/engine/result';
import type { Opening } from '../../../../shared/schemas/openings.schema';
import type { RoofSystem } from '../../../../shared/schemas/roof-system.schema';
import type { EdgeKind, TopKind } from '../../../../shared/schemas/schedule.schema';
import { faceDrawingModel } from '../lib/face-geometry';

export interface DrawnFace extends FaceShape {
  pitch_deg: number;
  top: TopKind;
}

interface FaceDrawingProps {
  face: DrawnFace;
  result: FaceResult;
  system: RoofSystem;
  /** Larger type for the one-face page. */
  large?: boolean;
  /** The openings in this face (each in every copy of it). */
  openings?: readonly Opening[];
}

const OPENING_WORDS: Record<Opening['kind'], string> = { roof_window: 'roof window', chimney: 'chimney', dormer: 'dormer', hatch: 'hatch' };

interface DrawnOpening {
  kind: Opening['kind'];
  x: number;
  y: number;
  width: number;
  height: number;
  /** The courses it crosses: the band the left-out tiles come from. */
  bandY: number;
  bandHeight: number;
  cuts: { x: number; y: number; width: number; height: number }[];
}

/**
 * Where the openings are drawn: their place on the face is not given, so they sit side by side
 * across the middle of the slope, each over the courses it crosses (ceil(height ÷ gauge), as the
 * engine counts), with a cut tile marked each side in each of those courses.
 */
function placeOpenings(openings: readonly Opening[], face: DrawnFace, result: FaceResult, tileWidth: number): DrawnOpening[] {
  const gauge = result.gauge_mm > 0 ? result.gauge_mm : face.rafter_mm;
  const list = openings.flatMap((o) => Array.from({ length: o.quantity }, () => o));
  const gap = result.cover_width_mm;
  const total = list.reduce((sum, o) => sum + o.width_mm, 0) + gap * Math.max(0, list.length - 1);
  const widest = Math.max(face.eaves_mm, face.top_mm);
  let x = Math.max(0, (widest - total) / 2) - Math.max(0, (widest - face.eaves_mm) / 2);
  return list.map((o) => {
    const crossed = Math.ceil(o.height_mm / gauge - 1e-9);
    const bandHeight = crossed * gauge;
    const bandY = Math.max(0, Math.round((face.rafter_mm - bandHeight) / 2 / gauge) * gauge);
    const y = bandY + (bandHeight - o.height_mm) / 2;
    const cuts = Array.from({ length: crossed }, (_, c) => [
      { x: x - Math.min(tileWidth, result.cover_width_mm), y: bandY + c * gauge, width: Math.min(tileWidth, result.cover_width_mm), height: gauge },
      { x: x + o.width_mm, y: bandY + c * gauge, width: Math.min(tileWidth, result.cover_width_mm), height: gauge },
    ]).flat();
    const drawn = { kind: o.kind, x, y, width: o.width_mm, height: o.height_mm, bandY, bandHeight, cuts };
    x += o.width_mm + gap;
    return drawn;
  });
}

const mm = (v: number) => Math.round(v).toLocaleString('en-GB');

/** "every batten", "every 2nd batten", "every 3rd batten". */
function everyNth(n: number): string {
  if (n === 1) return 'every batten';
  const suffix = n % 100 >= 11 && n % 100 <= 13 ? 'th' : (({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th');
  return `every ${n}${suffix} batten`;
}

const EDGE_WORDS: Record<EdgeKind | TopKind | 'eaves', string> = {
  eaves: 'eaves',
  verge: 'verge',
  hip: 'hip',
  valley: 'valley',
  abutment: 'abutment',
  ridge: 'ridge',
  mono_ridge: 'mono ridge',
};

/** How each kind of edge is drawn: the legend uses the same table, so the two cannot disagree. */
const EDGE_STYLE: Record<EdgeKind | TopKind | 'eaves', { className: string; dash?: string; width: number }> = {
  eaves: { className: 'stroke-ink-900', width: 3 },
  verge: { className: 'stroke-ink-900', width: 2.5 },
  hip: { className: 'stroke-clay-700', dash: '10 5', width: 2.5 },
  valley: { className: 'stroke-moss-700', dash: '2 4', width: 3 },
  abutment: { className: 'stroke-brick-700', width: 5 },
  ridge: { className: 'stroke-clay-700', width: 4 },
  mono_ridge: { className: 'stroke-clay-700', dash: '14 4 3 4', width: 4 },
};

function Swatch({ children }: { children: ReactNode }) {
  return (
    <svg viewBox="0 0 32 12" className="h-3 w-8 shrink-0" aria-hidden="true" focusable="false">
      {children}
    </svg>
  );
}

function EdgeSwatch({ kind }: { kind: keyof typeof EDGE_STYLE }) {
  const style = EDGE_STYLE[kind];
  return (
    <Swatch>
      <line x1="1" y1="6" x2="31" y2="6" className={style.className} strokeWidth={style.width} strokeDasharray={style.dash} />
    </Swatch>
  );
}

/**
 * One roof face drawn to scale from the engine's figures: its outline and edges, the rafters, a
 * batten for every course at the computed gauge, the loading battens (every nth from the top) with
 * the stacks the engine placed over the rafters, and the setting-out lines from the reference edge.
 * A list under the drawing says the same in words.
 */
export function FaceDrawing({ face, result, system, large = false, openings = [] }: FaceDrawingProps) {
  const uid = useId().replace(/:/g, '');
  const model = useMemo(() => faceDrawingModel(face, result, system), [face, result, system]);
  const drawnOpenings = useMemo(() => placeOpenings(openings, face, result, system.tile.width_mm), [openings, face, result, system.tile.width_mm]);
  const special = (result.eaves_tiles ?? 0) > 0 || (result.top_tiles ?? 0) > 0;
  const lastBatten = model.battens.length - 1;
  // Double lap: a tile-and-a-half at each verge of every second full course from the second.
  const tahCourses = (result.tile_and_half ?? 0) > 0 ? model.battens.filter((b) => b.index >= 2 && b.index <= lastBatten - 1 && b.index % 2 === 0) : [];
  const tahWidth = system.tile.width_mm * 1.5;
  const width = model.width.max - model.width.min;
  const size = Math.max(width, face.rafter_mm);
  const font = size / (large ? 40 : 30);
  // A stack is drawn centred on its batten over the rafter, small enough to leave the batten lines readable.
  const stackSide = Math.max(font * 0.9, Math.min(system.rafter_spacing_mm * 0.4, Math.max(result.gauge_mm, 100) * 0.6));
  const pad = font * 2.5 + stackSide / 2;
  const bottom = font * 5;
  const viewBox = [model.width.min - pad, -pad, width + 2 * pad, face.rafter_mm + pad + bottom].join(' ');
  const Y = (y: number) => face.rafter_mm - y;
  const [eavesLeft, eavesRight, topRight, topLeft] = model.outline;
  const loadingSet = new Set(model.loadingRows.map((r) => r.row));
  const referenceWords = { right_verge: 'the right-hand verge', left_verge: 'the left-hand verge', right_end: 'the right-hand end of the eaves' }[result.setting_out_from];
  const edges: { kind: keyof typeof EDGE_STYLE; from: { x: number; y: number }; to: { x: number; y: number }; label: string }[] = [
    { kind: 'eaves', from: eavesLeft, to: eavesRight, label: `eaves ${mm(face.eaves_mm)} mm` },
    { kind: face.right, from: eavesRight, to: topRight, label: EDGE_WORDS[face.right] },
    { kind: face.top, from: topRight, to: topLeft, label: face.top_mm > 0 ? `${EDGE_WORDS[face.top]} ${mm(face.top_mm)} mm` : EDGE_WORDS[face.top] },
    { kind: face.left, from: topLeft, to: eavesLeft, label: EDGE_WORDS[face.left] },
  ];
  const kindsShown = [...new Set(edges.map((e) => e.kind))];
  const name = `${result.building === '1' ? '' : `${result.building} · `}${result.face}`;
  const title = `${name}: ${model.battens.length} battens at ${result.gauge_mm} mm gauge, ${model.stacks.length} stacks on ${model.loadingRows.length} loading battens`;

  return (
    <figure className="space-y-3">
      <svg
        viewBox={viewBox}
        role="img"
        aria-labelledby={`${uid}-title ${uid}-desc`}
        className={`w-full rounded-md border border-mortar-300 bg-white ${large ? 'max-h-[70vh]' : 'max-h-96'}`}
        preserveAspectRatio="xMidYMid meet"
        data-testid="face-drawing"
      >
        <title id={`${uid}-title`}>{title}</title>
        <desc id={`${uid}-desc`}>{`Outline ${mm(face.eaves_mm)} mm at the eaves, ${mm(face.top_mm)} mm at the top, ${mm(face.rafter_mm)} mm up the slope. Setting-out lines from ${referenceWords}.`}</desc>
        <defs>
          <clipPath id={`${uid}-clip`}>
            <polygon points={model.outline.map((p) => `${p.x},${Y(p.y)}`).join(' ')} />
          </clipPath>
        </defs>
        <polygon points={model.outline.map((p) => `${p.x},${Y(p.y)}`).join(' ')} className="fill-mortar-100" />
        <g clipPath={`url(#${uid}-clip)`}>
          {model.rafters.map((x) => (
            <line key={`r${x}`} x1={x} y1={Y(0)} x2={x} y2={Y(face.rafter_mm)} className="stroke-ink-300" strokeWidth={1} vectorEffect="non-scaling-stroke" data-testid="rafter" />
          ))}
          {model.marks.map((mark) => (
            <line
              key={`m${mark.mm}`}
              x1={mark.x}
              y1={Y(0)}
              x2={mark.x}
              y2={Y(face.rafter_mm)}
              className="stroke-moss-600"
              strokeWidth={1.5}
              strokeDasharray="6 4"
              vectorEffect="non-scaling-stroke"
              data-testid="setting-out-line"
            />
          ))}
        </g>
        {model.battens.map((b) => (
          <line
            key={`b${b.index}`}
            x1={b.x1}
            y1={Y(b.y)}
            x2={b.x2}
            y2={Y(b.y)}
            className={loadingSet.has(b.index) ? 'stroke-ochre-500' : 'stroke-ink-600'}
            strokeWidth={loadingSet.has(b.index) ? 3 : 1.5}
            vectorEffect="non-scaling-stroke"
            data-testid={loadingSet.has(b.index) ? 'loading-batten' : 'batten'}
          />
        ))}
        {model.stacks.map((s, i) => (
          <rect
            key={`s${i}`}
            x={s.x - stackSide / 2}
            y={Y(s.y) - stackSide / 2}
            width={stackSide}
            height={stackSide}
            rx={stackSide * 0.15}
            className="fill-clay-600 stroke-white"
            strokeWidth={1}
            vectorEffect="non-scaling-stroke"
            data-testid="stack"
          />
        ))}
        {special
          ? model.battens
              .filter((b) => b.index === 0 || b.index === lastBatten)
              .map((b) => (
                <line
                  key={`sc${b.index}`}
                  x1={b.x1}
                  y1={Y(b.y)}
                  x2={b.x2}
                  y2={Y(b.y)}
                  className="stroke-clay-500"
                  strokeWidth={4}
                  strokeDasharray="8 3"
                  vectorEffect="non-scaling-stroke"
                  data-testid={b.index === 0 ? 'eaves-course' : 'top-course'}
                />
              ))
          : null}
        {tahCourses.flatMap((b) => {
          const left = Math.min(b.x1, b.x2);
          const right = Math.max(b.x1, b.x2);
          const marks = [];
          if (face.left === 'verge') marks.push(left);
          if (face.right === 'verge') marks.push(right - tahWidth);
          return marks.map((x) => (
            <rect key={`th${b.index}-${x}`} x={x} y={Y(b.y) - Math.max(result.gauge_mm, 1) / 2} width={tahWidth} height={Math.max(result.gauge_mm, 1)} className="fill-moss-600/60" data-testid="tile-and-half" />
          ));
        })}
        {drawnOpenings.map((o, i) => (
          <g key={`o${i}`}>
            <rect x={o.x} y={Y(o.bandY + o.bandHeight)} width={o.width} height={o.bandHeight} className="fill-ink-200" data-testid="opening-tiles-left-out" />
            {o.cuts.map((c, j) => (
              <rect
                key={j}
                x={c.x}
                y={Y(c.y + c.height)}
                width={c.width}
                height={c.height}
                className="fill-ochre-400/70 stroke-ochre-700"
                strokeWidth={1}
                vectorEffect="non-scaling-stroke"
                data-testid="opening-cut-tile"
              />
            ))}
            <rect x={o.x} y={Y(o.y + o.height)} width={o.width} height={o.height} className="fill-white stroke-ink-900" strokeWidth={2} vectorEffect="non-scaling-stroke" data-testid="opening" />
            <text x={o.x + o.width / 2} y={Y(o.y + o.height / 2)} fontSize={font * 0.7} textAnchor="middle" className="fill-ink-800">
              {OPENING_WORDS[o.kind]}
            </text>
          </g>
        ))}
        {edges.map((edge) => {
          const style = EDGE_STYLE[edge.kind];
          if (edge.from.x === edge.to.x && edge.from.y === edge.to.y) return null;
          return (
            <line
              key={`${edge.kind}-${edge.from.x}-${edge.from.y}`}
              x1={edge.from.x}
              y1={Y(edge.from.y)}
              x2={edge.to.x}
              y2={Y(edge.to.y)}
              className={style.className}
              strokeWidth={style.width}
              strokeDasharray={style.dash}
              strokeLinecap="round"
              vectorEffect="non-scaling-stroke"
            />
          );
        })}
        {model.marks.map((mark, i) => (
          <g key={`ml${mark.mm}`} className="fill-moss-800">
            <line x1={mark.x} y1={Y(0)} x2={mark.x} y2={Y(0) + font * 0.8} className="stroke-moss-700" strokeWidth={1.5} vectorEffect="non-scaling-stroke" />
            {i % Math.max(1, Math.ceil((model.marks.length * font * 4) / Math.max(1, width))) === 0 ? (
              <text x={mark.x} y={Y(0) + font * 1.9} fontSize={font * 0.8} textAnchor="middle">
                {mm(mark.mm)}
              </text>
            ) : null}
          </g>
        ))}
        <text x={(eavesLeft.x + eavesRight.x) / 2} y={Y(0) + font * 3.6} fontSize={font} textAnchor="middle" className="fill-ink-800">
          eaves {mm(face.eaves_mm)} mm · setting out from {referenceWords}
        </text>
        <text x={(topLeft.x + topRight.x) / 2} y={Y(face.rafter_mm) - stackSide / 2 - font * 0.5} fontSize={font} textAnchor="middle" className="fill-ink-800">
          {edges[2].label}
        </text>
        <text
          x={eavesRight.x + stackSide / 2 + font * 1.3}
          y={Y(face.rafter_mm / 2)}
          fontSize={font}
          textAnchor="middle"
          transform={`rotate(-90 ${eavesRight.x + stackSide / 2 + font * 1.3} ${Y(face.rafter_mm / 2)})`}
          className="fill-ink-800"
        >
          rafter {mm(face.rafter_mm)} mm · {face.right}
        </text>
        <text
          x={eavesLeft.x - stackSide / 2 - font * 0.7}
          y={Y(face.rafter_mm / 2)}
          fontSize={font}
          textAnchor="middle"
          transform={`rotate(-90 ${eavesLeft.x - stackSide / 2 - font * 0.7} ${Y(face.rafter_mm / 2)})`}
          className="fill-ink-800"
        >
          {face.left}
        </text>
      </svg>

      <figcaption className="space-y-3 text-sm">
        <ul className="flex flex-wrap gap-x-5 gap-y-1.5" aria-label="Legend">
          <li className="flex items-center gap-2">
            <Swatch>
              <line x1="1" y1="6" x2="31" y2="6" className="stroke-ink-600" strokeWidth={1.5} />
            </Swatch>
            Batten
          </li>
          <li className="flex items-center gap-2">
            <Swatch>
              <line x1="1" y1="6" x2="31" y2="6" className="stroke-ochre-500" strokeWidth={3} />
            </Swatch>
            Loading batten ({everyNth(system.roof_loading.every_nth_batten)} from the top)
          </li>
          <li className="flex items-center gap-2">
            <Swatch>
              <rect x="11" y="1" width="10" height="10" rx="1.5" className="fill-clay-600" />
            </Swatch>
            Stack of {system.roof_loading.stack_size} tiles over a rafter
          </li>
          <li className="flex items-center gap-2">
            <Swatch>
              <line x1="16" y1="0" x2="16" y2="12" className="stroke-ink-300" strokeWidth={1.5} />
            </Swatch>
            Rafter ({mm(system.rafter_spacing_mm)} mm centres)
          </li>
          <li className="flex items-center gap-2">
            <Swatch>
              <line x1="16" y1="0" x2="16" y2="12" className="stroke-moss-600" strokeWidth={1.5} strokeDasharray="3 2" />
            </Swatch>
            Setting-out line
          </li>
          {special ? (
            <li className="flex items-center gap-2">
              <Swatch>
                <line x1="1" y1="6" x2="31" y2="6" className="stroke-clay-500" strokeWidth={4} strokeDasharray="8 3" />
              </Swatch>
              Eaves course and top course (short tiles)
            </li>
          ) : null}
          {tahCourses.length > 0 ? (
            <li className="flex items-center gap-2">
              <Swatch>
                <rect x="8" y="2" width="16" height="8" className="fill-moss-600/60" />
              </Swatch>
              Tile-and-a-half at the verge
            </li>
          ) : null}
          {drawnOpenings.length > 0 ? (
            <li className="flex items-center gap-2">
              <Swatch>
                <rect x="2" y="1" width="6" height="10" className="fill-ochre-400/70" />
                <rect x="10" y="1" width="12" height="10" className="fill-ink-200" />
                <rect x="24" y="1" width="6" height="10" className="fill-ochre-400/70" />
              </Swatch>
              Opening: tiles left out (grey) and cut tiles (ochre)
            </li>
          ) : null}
          {kindsShown.map((kind) => (
            <li key={kind} className="flex items-center gap-2">
              <EdgeSwatch kind={kind} />
              {EDGE_WORDS[kind].replace(/^./, (c) => c.toUpperCase())}
            </li>
          ))}
        </ul>
        <details className="rounded-md border border-mortar-300 bg-white px-3 py-2">
          <summary className="min-h-tap cursor-pointer content-center font-semibold">The drawing in words</summary>
          <ul className="mt-2 list-disc space-y-1 pl-5" data-testid="face-drawing-words">
            <li>
              Outline: {mm(face.eaves_mm)} mm at the eaves, {mm(face.top_mm)} mm at the top ({EDGE_WORDS[face.top]}), {mm(face.rafter_mm)} mm up the slope at {face.pitch_deg}°; left edge {EDGE_WORDS[face.left]}, right
              edge {EDGE_WORDS[face.right]}.
            </li>
            <li>
              {model.battens.length} battens, one per course, at {result.gauge_mm} mm gauge ({result.headlap_mm} mm headlap): the first {mm(model.first_batten_mm)} mm up from the eaves, the top one at{' '}
              {mm(model.top_batten_mm)} mm.
            </li>
            <li>
              {model.stacks.length} stacks of up to {system.roof_loading.stack_size} tiles ({result.stack_positions} places over the rafters):{' '}
              {model.loadingRows.length === 0 ? 'no loading battens on this face.' : model.loadingRows.map((row) => `batten ${row.row + 1} from the eaves, ${row.stacks}`).join('; ')}.
            </li>
            {special ? (
              <li>
                {result.eaves_tiles} eaves tiles in the first course, {result.top_tiles} top tiles in the last; {result.tile_and_half} tiles-and-a-half at the verges of every second full course.
              </li>
            ) : null}
            {openings.length > 0 ? (
              <li>
                Openings (positions not given, drawn side by side at mid-slope): {openings.map((o) => `${o.quantity} × ${OPENING_WORDS[o.kind]} ${mm(o.width_mm)} × ${mm(o.height_mm)} mm`).join('; ')};{' '}
                {result.openings_area_m2} m² left untiled.
              </li>
            ) : null}
            <li>
              Setting-out marks from {referenceWords}: {model.marks.length === 0 ? 'none (three tiles or fewer a course).' : `${model.marks.map((m) => mm(m.mm)).join(', ')} mm.`}
            </li>
          </ul>
        </details>
      </figcaption>
    </figure>
  );
}
