import { useMemo, useState } from 'react';
import { CATEGORY_LABELS, PRODUCT_CATEGORIES } from '../../../../shared/schemas/catalogue.schema';
import type { ProductCategory } from '../../../../shared/schemas/catalogue.schema';
import { DEFAULT_PALLET_MM } from '../../../../shared/schemas/price-list.schema';
import type { Product } from '../../../../shared/schemas/price-list.schema';
import { BONDS, TILE_KINDS } from '../../../../shared/schemas/roof-system.schema';
import { FieldGroup, Form, SelectField, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import type { SchemaForm } from '../../../components/form/use-schema-form';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { useCreateProduct } from '../api/create-product';
import { useUpdateProduct } from '../api/update-product';
import { showingFieldDetails } from '../lib/form-values';
import { SaveOrCancel } from './save-or-cancel';
import { TECHNICAL_FIELDS, headlapBandsText, productFormSchema, taxPercentText, technicalField, technicalText } from '../lib/product-form';
import type { HeadlapBandText } from '../lib/product-form';

const CATEGORY_OPTIONS = [{ value: '', label: 'Choose a category' }, ...PRODUCT_CATEGORIES.map((c) => ({ value: c, label: CATEGORY_LABELS[c] }))];
const KIND_WORDS: Record<(typeof TILE_KINDS)[number], string> = { single_lap: 'Single-lap (interlocking)', double_lap: 'Double-lap (plain tile or slate)' };
const BOND_WORDS: Record<(typeof BONDS)[number], string> = { broken: 'Broken bond', straight: 'Straight bond' };

function TileFields({ form, product }: { form: SchemaForm; product: Product | null }) {
  const [bands] = useState<HeadlapBandText[]>(() => headlapBandsText(product));
  const [count, setCount] = useState(bands.length);
  // Bands are named by their place; removing one moves the typed values of those below it up a row.
  const removeBand = (index: number) => {
    for (let i = index; i < count - 1; i++) {
      for (const key of ['from_pitch_deg', 'min_mm'] as const) {
        form.methods.setValue(technicalField('headlap_mm', i, key), form.methods.getValues(technicalField('headlap_mm', i + 1, key)) as string);
      }
    }
    setCount(count - 1);
  };
  const t = (...path: string[]) => technicalText(product, ...path);
  return (
    <div className="space-y-4">
      <Alert tone="caution" title="Take these from the tile maker">
        Sizes, headlaps per pitch and fixings come from the tile maker&rsquo;s data and fixing specification; every roof is laid to that specification, the local codes and licensed practice for its pitch and exposure.
      </Alert>
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField name={technicalField('kind')} label="Tile kind" options={[{ value: '', label: 'Choose the kind' }, ...TILE_KINDS.map((k) => ({ value: k, label: KIND_WORDS[k] }))]} defaultValue={t('kind')} />
        <TextField name={technicalField('length_mm')} label="Tile length (mm)" inputMode="decimal" defaultValue={t('length_mm')} />
        <TextField name={technicalField('width_mm')} label="Tile width (mm)" inputMode="decimal" defaultValue={t('width_mm')} />
        <TextField name={technicalField('weight_kg')} label="Weight of one tile (kg)" inputMode="decimal" defaultValue={t('weight_kg')} />
        <TextField name={technicalField('per_pallet')} label="Tiles per pallet" inputMode="numeric" defaultValue={t('per_pallet')} />
        <TextField name={technicalField('nails_per_tile')} label="Nails per tile (optional)" hint="Blank: as usual for the kind." inputMode="numeric" defaultValue={t('nails_per_tile')} />
        <SelectField name={technicalField('bond')} label="Bond (optional)" options={[{ value: '', label: 'As usual for the kind' }, ...BONDS.map((b) => ({ value: b, label: BOND_WORDS[b] }))]} defaultValue={t('bond')} />
        <SelectField
          name={technicalField('halves_per_tile')}
          label="Halves cut from one tile (optional)"
          options={[
            { value: '', label: 'As usual for the kind' },
            { value: '1', label: '1' },
            { value: '2', label: '2' },
          ]}
          defaultValue={t('halves_per_tile')}
        />
      </div>
      <FieldGroup
        name={technicalField('cover_width_mm')}
        legend="Cover width (mm)"
        hint="Needed for a single-lap tile: the side lock's closed, nominal and open cover. Leave blank for a double-lap tile (its cover is its width)."
      >
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField name={technicalField('cover_width_mm', 'min')} label="Closed up (min)" inputMode="decimal" defaultValue={t('cover_width_mm', 'min')} />
          <TextField name={technicalField('cover_width_mm', 'nominal')} label="Nominal" inputMode="decimal" defaultValue={t('cover_width_mm', 'nominal')} />
          <TextField name={technicalField('cover_width_mm', 'max')} label="Spread (max)" inputMode="decimal" defaultValue={t('cover_width_mm', 'max')} />
        </div>
      </FieldGroup>
      <FieldGroup name={technicalField('headlap_mm')} legend="Headlap by pitch" hint="One row per pitch band: the minimum headlap from that pitch upwards. The lowest band is the lowest pitch the tile may be laid at.">
        <ol className="space-y-3">
          {Array.from({ length: count }, (_, i) => (
            <li key={i} className="grid items-end gap-3 sm:grid-cols-[1fr_1fr_auto]">
              <TextField name={technicalField('headlap_mm', i, 'from_pitch_deg')} label={`Band ${i + 1}: from pitch (°)`} inputMode="decimal" defaultValue={bands[i]?.from_pitch_deg ?? ''} />
              <TextField name={technicalField('headlap_mm', i, 'min_mm')} label={`Band ${i + 1}: minimum headlap (mm)`} inputMode="decimal" defaultValue={bands[i]?.min_mm ?? ''} />
              {count > 1 ? (
                <Button variant="ghost" onClick={() => removeBand(i)}>
                  Remove band {i + 1}
                </Button>
              ) : null}
            </li>
          ))}
        </ol>
        <Button variant="secondary" className="mt-3" onClick={() => setCount(count + 1)}>
          Add a pitch band
        </Button>
      </FieldGroup>
    </div>
  );
}

function TechnicalFields({ form, category, product }: { form: SchemaForm; category: ProductCategory; product: Product | null }) {
  const same = product?.category === category ? product : null;
  if (category === 'tile') return <TileFields form={form} product={same} />;
  const fields = TECHNICAL_FIELDS[category];
  if (fields.length === 0) return <p className="text-sm text-ink-600">An accessory needs no technical fields.</p>;
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      {fields.map((f) => (
        <TextField key={f.key} name={technicalField(f.key)} label={f.label} hint={f.hint} inputMode="decimal" defaultValue={technicalText(same, f.key)} />
      ))}
    </div>
  );
}

/** Adding a product to the catalogue, or changing one (`product` given), with the technical fields its category needs. */
export function ProductForm({ product = null, onDone }: { product?: Product | null; onDone?: () => void }) {
  const create = useCreateProduct();
  const update = useUpdateProduct(product?.id ?? 0);
  const toast = useToast();
  const [category, setCategory] = useState<ProductCategory | ''>(product?.category ?? '');
  const schema = useMemo(() => productFormSchema(product), [product]);
  const form = useSchemaForm({
    schema,
    onSubmit: showingFieldDetails(async (body, { reset }) => {
      const saved = product ? await update.mutateAsync(body) : await create.mutateAsync(body);
      toast.show(product ? `${saved.sku} is saved.` : `${saved.sku} is added to the catalogue.`, 'success');
      if (!product) {
        reset();
        setCategory('');
      }
      onDone?.();
    }),
  });
  return (
    <Form form={form} label={product ? `Change ${product.sku}` : 'Add a product'}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField name="sku" label="SKU" hint="Your own code: letters, digits and - _ . /" autoComplete="off" maxLength={40} defaultValue={product?.sku ?? ''} />
        <TextField name="name" label="Name" maxLength={160} defaultValue={product?.name ?? ''} />
        <SelectField name="category" label="Category" options={CATEGORY_OPTIONS} value={category} onChange={(e) => setCategory(e.target.value as ProductCategory | '')} />
        <TextField name="unit" label="Unit" hint="What one is counted in: piece, roll, length, m…" maxLength={20} defaultValue={product?.unit ?? ''} />
        <TextField name="pack_size" label="Pack size (units in one pack)" inputMode="numeric" defaultValue={product ? String(product.pack_size) : ''} />
        <TextField name="pack_weight_kg" label="Pack weight (kg)" inputMode="decimal" defaultValue={product ? String(product.pack_weight_kg) : ''} />
        <TextField name="tax_rate_bp" label="Tax rate (%)" hint="20 for 20 %." inputMode="decimal" defaultValue={taxPercentText(product?.tax_rate_bp ?? 2000)} />
      </div>
      <fieldset className="rounded-md border border-mortar-300 p-3">
        <legend className="px-1 font-medium text-ink-900">Pallet footprint</legend>
        <p className="mb-2 text-sm text-ink-600">The pallet it travels on, as the lorry&rsquo;s deck plan lays it out: 1200 × 1000 mm for the usual pallet, 1200 × 800 mm for the smaller one.</p>
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField name="pallet_length_mm" label="Pallet length (mm)" inputMode="numeric" defaultValue={String(product?.pallet_length_mm ?? DEFAULT_PALLET_MM.length)} />
          <TextField name="pallet_width_mm" label="Pallet width (mm)" inputMode="numeric" defaultValue={String(product?.pallet_width_mm ?? DEFAULT_PALLET_MM.width)} />
        </div>
      </fieldset>
      {category ? (
        <section aria-label={`Technical fields for ${CATEGORY_LABELS[category]}`} className="space-y-3">
          <h3 className="font-semibold text-ink-900">Technical fields: {CATEGORY_LABELS[category]}</h3>
          <TechnicalFields key={category} form={form} category={category} product={product} />
        </section>
      ) : null}
      <SaveOrCancel submitLabel={product ? 'Save the product' : 'Add the product'} onCancel={onDone} />
    </Form>
  );
}
