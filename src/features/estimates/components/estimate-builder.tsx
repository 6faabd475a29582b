import { Suspense, lazy, useCallback, useDeferredValue, useEffect, useId, useMemo, useRef, useState } from 'react';
import type { FormEvent } from 'react';
import { DEFAULT_TILE, SYSTEM_DEFAULTS } from '../../../../shared/engine/defaults';
import type { Estimate } from '../../../../shared/schemas/estimate.schema';
import type { Opening } from '../../../../shared/schemas/openings.schema';
import type { Face } from '../../../../shared/schemas/schedule.schema';
import { Form, SelectField, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useCreateEstimate } from '../api/create-estimate';
import { useSystems } from '../api/get-systems';
import { HEADLAP_ROWS, SPECIAL_PIECE_FIELDS, VALLEY_KIND_FIELD, VERGE_KIND_FIELD, WASTE_FIELDS, estimateFormSchema, headlapField, tileField, valleyField } from '../lib/estimate-form';
import { SystemPicker } from './system-picker';

/** The engine and the face table arrive after the form: the preview says it is loading meanwhile. */
const EstimatePreview = lazy(() => import('./estimate-preview').then((m) => ({ default: m.EstimatePreview })));

const WASTE_LABELS: Record<(typeof WASTE_FIELDS)[number], string> = {
  tiles: 'Tiles',
  battens: 'Battens',
  underlay: 'Underlay',
  ridge_hip: 'Ridge and hip',
};

function readValues(form: HTMLFormElement | null): Record<string, string> {
  const values: Record<string, string> = {};
  if (!form) return values;
  for (const [key, value] of new FormData(form).entries()) if (typeof value === 'string') values[key] = value;
  return values;
}

const SPECIAL_PIECES: Record<(typeof SPECIAL_PIECE_FIELDS)[number], { label: string; share: number; blank: string }> = {
  eaves_tile_kg: { label: 'Eaves tile (kg)', share: 1, blank: 'as a full tile' },
  top_tile_kg: { label: 'Top tile (kg)', share: 1, blank: 'as a full tile' },
  tile_and_half_kg: { label: 'Tile-and-a-half (kg)', share: 1.5, blank: 'one and a half full tiles' },
};

/** What a special piece left blank weighs: the engine's rule, with the figure for the tile weight typed. */
function specialPieceHint(field: (typeof SPECIAL_PIECE_FIELDS)[number], tileWeight: string | undefined): string {
  const piece = SPECIAL_PIECES[field];
  const text = (tileWeight ?? '').trim().replace(',', '.');
  const weight = Number(text);
  const figure = text !== '' && Number.isFinite(weight) && weight > 0 ? ` (${Number((piece.share * weight).toFixed(3))} kg)` : '';
  return `Blank: ${piece.blank}${figure}`;
}

/** The generic system's fields; `values` is the form as it stands, for the fields that depend on a choice. */
function GenericSystemFields({ values }: { values: Record<string, string> }) {
  const doubleLap = (values[tileField('kind')] ?? DEFAULT_TILE.kind) === 'double_lap';
  const trough = (values[VALLEY_KIND_FIELD] ?? SYSTEM_DEFAULTS.valley.kind) === 'trough';
  return (
    <div className="space-y-4">
      <p className="text-sm text-ink-700">
        Type the figures from the tile maker&rsquo;s data sheet. Anything left blank takes Ridgeload&rsquo;s generic figures, which are typical of the kind and no maker&rsquo;s product.
      </p>
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          name={tileField('kind')}
          label="Kind of tile"
          defaultValue={DEFAULT_TILE.kind}
          options={[
            { value: 'single_lap', label: 'Single lap (interlocking)' },
            { value: 'double_lap', label: 'Double lap (plain tile or slate)' },
          ]}
        />
        <TextField name={tileField('name')} label="Name (for you)" autoComplete="off" />
        <TextField name={tileField('length_mm')} label="Length (mm)" inputMode="decimal" defaultValue={DEFAULT_TILE.length_mm} />
        <TextField name={tileField('width_mm')} label="Width (mm)" inputMode="decimal" defaultValue={DEFAULT_TILE.width_mm} />
        <TextField name={tileField('weight_kg')} label="Weight of one tile (kg)" inputMode="decimal" defaultValue={DEFAULT_TILE.weight_kg} />
        <TextField name={tileField('per_pallet')} label="Tiles a pallet" inputMode="numeric" defaultValue={DEFAULT_TILE.per_pallet} />
      </div>
      <fieldset>
        <legend className="mb-1.5 font-medium">Cover width (mm), for a single-lap tile</legend>
        <p className="mb-2 text-sm text-ink-600">The side lock&rsquo;s play: closed up, nominal, spread. Leave blank for a double-lap tile.</p>
        <div className="grid grid-cols-3 gap-3">
          <TextField name={tileField('cover_width_mm.min')} label="Closed" inputMode="decimal" defaultValue={DEFAULT_TILE.cover_width_mm.min} />
          <TextField name={tileField('cover_width_mm.nominal')} label="Nominal" inputMode="decimal" defaultValue={DEFAULT_TILE.cover_width_mm.nominal} />
          <TextField name={tileField('cover_width_mm.max')} label="Spread" inputMode="decimal" defaultValue={DEFAULT_TILE.cover_width_mm.max} />
        </div>
      </fieldset>
      <fieldset>
        <legend className="mb-1.5 font-medium">Headlap by pitch</legend>
        <p className="mb-2 text-sm text-ink-600">From each pitch up, the least headlap. The lowest pitch given is the lowest the tile may be laid at.</p>
        <div className="space-y-2">
          {Array.from({ length: HEADLAP_ROWS }, (_, i) => (
            <div key={i} className="grid grid-cols-2 gap-3">
              <TextField name={headlapField(i, 'from_pitch_deg')} label={`From pitch (°), band ${i + 1}`} inputMode="decimal" defaultValue={DEFAULT_TILE.headlap_mm[i]?.from_pitch_deg} />
              <TextField name={headlapField(i, 'min_mm')} label={`Headlap (mm), band ${i + 1}`} inputMode="decimal" defaultValue={DEFAULT_TILE.headlap_mm[i]?.min_mm} />
            </div>
          ))}
        </div>
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          name={tileField('bond')}
          label="Bond"
          defaultValue={DEFAULT_TILE.bond}
          options={[
            { value: '', label: 'As usual for the kind' },
            { value: 'broken', label: 'Broken bond' },
            { value: 'straight', label: 'Straight bond' },
          ]}
        />
        <TextField name={tileField('nails_per_tile')} label="Nails a tile" inputMode="numeric" hint="Blank: as usual for the kind" />
        <TextField name="system.rafter_spacing_mm" label="Rafter centres (mm)" inputMode="decimal" defaultValue={SYSTEM_DEFAULTS.rafter_spacing_mm} />
      </div>
      {doubleLap ? (
        <fieldset>
          <legend className="mb-1.5 font-medium">Special pieces, for a double-lap tile</legend>
          <p className="mb-2 text-sm text-ink-600">The weight of one of each, from the data sheet: the eaves and top courses are of short tiles, and a tile-and-a-half keeps the bond at each verge.</p>
          <div className="grid gap-3 sm:grid-cols-3">
            {SPECIAL_PIECE_FIELDS.map((field) => (
              <TextField key={field} name={tileField(field)} label={SPECIAL_PIECES[field].label} inputMode="decimal" hint={specialPieceHint(field, values[tileField('weight_kg')])} />
            ))}
          </div>
        </fieldset>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          name={VERGE_KIND_FIELD}
          label="Verges"
          defaultValue={SYSTEM_DEFAULTS.verge.kind}
          hint="Dry verges take a unit on every course and a cap at each ridge end."
          options={[
            { value: 'mortar', label: 'Bedded in mortar' },
            { value: 'dry', label: 'Dry verge units' },
          ]}
        />
        <SelectField
          name={VALLEY_KIND_FIELD}
          label="Valleys"
          defaultValue={SYSTEM_DEFAULTS.valley.kind}
          hint="A lined valley is ordered by the metre; trough units are counted."
          options={[
            { value: 'lined', label: 'Lined (lead or a roll lining)' },
            { value: 'trough', label: 'Preformed trough units' },
          ]}
        />
      </div>
      {trough ? (
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField name={valleyField('unit_length_mm')} label="Trough unit length (mm)" inputMode="decimal" defaultValue={SYSTEM_DEFAULTS.valley.unit_length_mm} hint="From the trough maker's data sheet" />
          <TextField name={valleyField('lap_mm')} label="Lap between units (mm)" inputMode="decimal" defaultValue={SYSTEM_DEFAULTS.valley.lap_mm} hint="Less than the unit length" />
        </div>
      ) : null}
    </div>
  );
}

interface EstimateBuilderProps {
  projectId: number;
  /** The faces of the schedule version being estimated, as the engine reads them. */
  faces: readonly Face[];
  /** The openings of those faces. */
  openings?: readonly Opening[];
  scheduleVersion: number;
  onCreated: (estimate: Estimate) => void;
}

/**
 * Choosing the roof system for an estimate, with the engine's figures worked out in the browser as
 * the form changes; saving asks the server to work them out again, price them and keep them.
 */
/** One shared empty list, so the preview is not worked out again on every render. */
const NO_OPENINGS: readonly Opening[] = [];

export function EstimateBuilder({ projectId, faces, openings = NO_OPENINGS, scheduleVersion, onCreated }: EstimateBuilderProps) {
  const systems = useSystems();
  const create = useCreateEstimate(projectId);
  const wrapper = useRef<HTMLDivElement>(null);
  const kindId = useId();
  const [source, setSource] = useState<'catalogue' | 'generic'>('catalogue');
  const [kind, setKind] = useState<'all' | 'single_lap' | 'double_lap'>('all');
  const [chosenId, setChosenId] = useState<number | null>(null);
  const [values, setValues] = useState<Record<string, string>>({});
  const deferredValues = useDeferredValue(values);

  const form = useSchemaForm({
    schema: estimateFormSchema,
    onSubmit: async (body) => onCreated(await create.mutateAsync({ ...body, schedule_version: scheduleVersion })),
  });

  const refresh = useCallback(() => setValues(readValues(wrapper.current?.closest('form') ?? null)), []);
  // Inputs that appear or change their defaults (another system's waste) are read once they are on the page.
  // So do the fields a choice shows (a double-lap tile's special pieces, trough units' length and lap).
  const tileKind = values[tileField('kind')];
  const valleyKind = values[VALLEY_KIND_FIELD];
  useEffect(refresh, [refresh, systems.data, source, chosenId, tileKind, valleyKind]);

  const offers = useMemo(() => systems.data ?? [], [systems.data]);
  const shown = kind === 'all' ? offers : offers.filter((o) => o.tile.kind === kind);
  const chosen = offers.find((o) => o.id === chosenId) ?? null;
  const wasteDefaults = source === 'catalogue' && chosen ? chosen.system.waste_pct : SYSTEM_DEFAULTS.waste_pct;

  function onChange(event: FormEvent<HTMLDivElement>) {
    const target = event.target as HTMLInputElement;
    if (target.name === 'source' || target.name === 'system_id') {
      const nextSource = target.name === 'source' ? (target.value === 'generic' ? 'generic' : 'catalogue') : source;
      const nextId = target.name === 'system_id' ? Number(target.value) : chosenId;
      const offer = offers.find((o) => o.id === nextId);
      // The waste starts again from the figures of the system now chosen.
      const defaults = nextSource === 'catalogue' && offer ? offer.system.waste_pct : SYSTEM_DEFAULTS.waste_pct;
      for (const field of WASTE_FIELDS) form.methods.setValue(`waste_pct.${field}`, String(defaults[field]));
      setSource(nextSource);
      setChosenId(nextId);
    }
    refresh();
  }

  return (
    <Form form={form} label="New estimate" className="grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <div ref={wrapper} onChange={onChange} onInput={onChange} className="space-y-6">
        <Card title="Roof system">
          <fieldset className="mb-4">
            <legend className="sr-only">Where the system comes from</legend>
            <div className="grid gap-2 sm:grid-cols-2">
              {[
                { value: 'catalogue', label: 'A merchant’s roof system', hint: 'Tile and matching accessories, priced by the branch' },
                { value: 'generic', label: 'A generic system', hint: 'Type the tile’s figures; quantities only, no prices' },
              ].map((option) => (
                <label key={option.value} className="flex min-h-tap cursor-pointer items-start gap-3 rounded-md border border-ink-300 bg-white p-3 has-[:checked]:border-clay-600 has-[:checked]:bg-clay-50">
                  <input type="radio" {...form.register('source')} value={option.value} defaultChecked={option.value === 'catalogue'} className="mt-1 h-5 w-5 accent-clay-600" />
                  <span>
                    <span className="block font-medium">{option.label}</span>
                    <span className="block text-sm text-ink-600">{option.hint}</span>
                  </span>
                </label>
              ))}
            </div>
          </fieldset>

          <div hidden={source !== 'catalogue'} className="space-y-4">
            <div className="max-w-xs">
              <label htmlFor={kindId} className="mb-1.5 block font-medium">
                Show
              </label>
              <select id={kindId} value={kind} onChange={(event) => setKind(event.target.value as typeof kind)} className="block min-h-tap w-full rounded-md border border-ink-300 bg-white px-2">
                <option value="all">Every kind of tile</option>
                <option value="single_lap">Single-lap tiles</option>
                <option value="double_lap">Plain tiles and slates</option>
              </select>
            </div>
            {form.fieldError('system_id') ? (
              <p id={`${form.id}-system-error`} className="text-sm font-medium text-brick-700">
                {form.fieldError('system_id')}
              </p>
            ) : null}
            {systems.isPending ? (
              <SkeletonBlock label="Loading the merchants’ roof systems" lines={4} />
            ) : systems.isError ? (
              <ErrorAlert error={systems.error} title="The roof systems could not be loaded" onRetry={() => void systems.refetch()} />
            ) : shown.length === 0 ? (
              <EmptyState title="No roof systems to choose from">Merchants have not listed any of this kind yet; a generic system works meanwhile.</EmptyState>
            ) : (
              <SystemPicker systems={shown} faces={faces} chosenId={chosenId} error={form.fieldError('system_id')} describedBy={form.fieldError('system_id') ? `${form.id}-system-error` : undefined} />
            )}
          </div>

          <div hidden={source !== 'generic'}>
            <GenericSystemFields values={values} />
          </div>
        </Card>

        <Card title="Waste allowed">
          <p className="mb-3 text-sm text-ink-700">Per cent over the net quantities, for cutting and breakage. They start from the system&rsquo;s own figures.</p>
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
            {WASTE_FIELDS.map((field) => (
              <TextField key={field} name={`waste_pct.${field}`} label={`${WASTE_LABELS[field]} (%)`} inputMode="decimal" defaultValue={wasteDefaults[field]} />
            ))}
          </div>
        </Card>

        <SubmitButton size="lg">Save the estimate</SubmitButton>
      </div>

      <div className="xl:sticky xl:top-6">
        <Card title="Preview">
          <p className="mb-3 text-sm text-ink-600" aria-live="polite">
            Worked out in your browser by the same rules the saved estimate uses, for schedule version {scheduleVersion} ({faces.length} {faces.length === 1 ? 'face' : 'faces'}). Prices come when you save.
          </p>
          <Suspense fallback={<SkeletonBlock label="Loading the preview" lines={4} />}>
            <EstimatePreview values={deferredValues} faces={faces} offers={offers} openings={openings} />
          </Suspense>
        </Card>
      </div>
    </Form>
  );
}
