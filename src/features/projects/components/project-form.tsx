import { useMemo, useRef, useState } from 'react';
import { CRANE_LIFT, CRANE_LIFT_LABELS, OVERHEAD_LINES, OVERHEAD_LINES_LABELS, VEHICLE_ACCESS, VEHICLE_ACCESS_LABELS, createProjectBodySchema, updateProjectBodySchema } from '../../../../shared/schemas/project.schema';
import type { BUILDING_KINDS, Project } from '../../../../shared/schemas/project.schema';
import { Form, RadioGroupField, SelectField, SubmitButton, TextAreaField, TextField, useFieldGroup, useSchemaFormContext } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { useCreateProject } from '../api/create-project';
import { useUpdateProject } from '../api/update-project';

interface BuildingRow {
  key: number;
  name: string;
  kind: (typeof BUILDING_KINDS)[number];
  notes: string;
}

const options = <T extends string>(values: readonly T[], labels: Record<T, string>) => values.map((value) => ({ value, label: labels[value] }));

function BuildingItem({ row, index, onUpdate, onRemove }: { row: BuildingRow; index: number; onUpdate: (patch: Partial<BuildingRow>) => void; onRemove: () => void }) {
  // The rows live in state and go to the schema as `buildings`; the name's path still carries its errors.
  const name = `buildings.${index}.name`;
  const { error, errorId } = useFieldGroup(name);
  const { clearFieldError } = useSchemaFormContext();
  return (
    <li className="grid gap-2 rounded-md border border-mortar-300 p-3 sm:grid-cols-[1fr_10rem_1.5fr_auto] sm:items-end">
      <label className="block">
        <span className="mb-1 block text-sm font-medium">Name</span>
        <input
          value={row.name}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? errorId : undefined}
          onChange={(event) => {
            clearFieldError(name);
            onUpdate({ name: event.target.value });
          }}
          className={`block min-h-tap w-full rounded-md border bg-white px-3 ${error ? 'border-brick-600' : 'border-ink-300'}`}
        />
        {error ? (
          <span id={errorId} className="mt-1 block text-sm font-medium text-brick-700">
            {error}
          </span>
        ) : null}
      </label>
      <label className="block">
        <span className="mb-1 block text-sm font-medium">Kind</span>
        <select value={row.kind} onChange={(event) => onUpdate({ kind: event.target.value as BuildingRow['kind'] })} className="block min-h-tap w-full rounded-md border border-ink-300 bg-white px-2">
          <option value="building">Building</option>
          <option value="plot">Plot</option>
        </select>
      </label>
      <label className="block">
        <span className="mb-1 block text-sm font-medium">Notes</span>
        <input value={row.notes} onChange={(event) => onUpdate({ notes: event.target.value })} className="block min-h-tap w-full rounded-md border border-ink-300 bg-white px-3" />
      </label>
      <Button variant="ghost" onClick={onRemove} aria-label={`Remove ${row.name || `building ${index + 1}`}`}>
        Remove
      </Button>
    </li>
  );
}

function BuildingsEditor({ rows, onChange }: { rows: BuildingRow[]; onChange: (rows: BuildingRow[]) => void }) {
  const nextKey = useRef(rows.length + 1);
  const update = (key: number, patch: Partial<BuildingRow>) => onChange(rows.map((row) => (row.key === key ? { ...row, ...patch } : row)));
  return (
    <fieldset className="space-y-3">
      <legend className="font-medium text-ink-900">Buildings or plots</legend>
      <p className="text-sm text-ink-600">
        Optional. Name the house types or plots the way the schedule&rsquo;s <code>building</code> column does, so the roofs and deliveries line up.
      </p>
      {rows.length === 0 ? <p className="text-sm text-ink-600">None listed.</p> : null}
      <ul className="space-y-3">
        {rows.map((row, index) => (
          <BuildingItem key={row.key} row={row} index={index} onUpdate={(patch) => update(row.key, patch)} onRemove={() => onChange(rows.filter((r) => r.key !== row.key))} />
        ))}
      </ul>
      <Button
        variant="secondary"
        onClick={() => {
          onChange([...rows, { key: nextKey.current++, name: '', kind: 'building', notes: '' }]);
        }}
      >
        Add a building or plot
      </Button>
    </fieldset>
  );
}

function SiteFields({ project }: { project?: Project }) {
  return (
    <>
      <Card title="The site">
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField name="name" label="Site name" defaultValue={project?.name} autoComplete="off" className="sm:col-span-2" />
          <TextField name="reference" label="Your reference" hint="Optional: job number" defaultValue={project?.reference} autoComplete="off" />
          <TextField name="site_postcode" label="Postcode" defaultValue={project?.site_postcode} autoComplete="postal-code" />
          <TextAreaField name="site_address" label="Site address" rows={2} defaultValue={project?.site_address} className="sm:col-span-2" />
          <TextField name="contact_name" label="Contact on site" defaultValue={project?.contact_name} autoComplete="off" />
          <TextField name="contact_phone" label="Their phone" type="tel" inputMode="tel" defaultValue={project?.contact_phone} autoComplete="off" />
        </div>
      </Card>
      <Card title="Access for deliveries">
        <div className="space-y-4">
          <SelectField name="vehicle_access" label="Biggest lorry that can reach the set-down place" options={options(VEHICLE_ACCESS, VEHICLE_ACCESS_LABELS)} defaultValue={project?.vehicle_access ?? 'any'} />
          <RadioGroupField name="crane_lift" legend="Crane lift from the lorry" options={options(CRANE_LIFT, CRANE_LIFT_LABELS)} defaultValue={project?.crane_lift ?? 'unknown'} />
          <RadioGroupField name="overhead_lines" legend="Overhead lines" options={options(OVERHEAD_LINES, OVERHEAD_LINES_LABELS)} defaultValue={project?.overhead_lines ?? 'unknown'} />
          <TextField name="set_down_place" label="Where pallets are set down" hint="e.g. hardstanding by the site cabin" defaultValue={project?.set_down_place} autoComplete="off" />
          <TextAreaField
            name="access_notes"
            label="Access notes for the driver"
            hint="Gate times, width or weight limits, ground conditions, anything a driver should know before arriving."
            rows={4}
            defaultValue={project?.access_notes}
          />
        </div>
      </Card>
    </>
  );
}

function initialRows(project?: Project): BuildingRow[] {
  return (project?.buildings ?? []).map((b, i) => ({ key: i + 1, name: b.name, kind: b.kind, notes: b.notes }));
}

function buildingsBody(rows: BuildingRow[]) {
  return rows.map(({ name, kind, notes }) => ({ name, kind, notes }));
}

/** A new site: the address, who to ring, and what a lorry finds when it arrives. */
export function CreateProjectForm({ onCreated }: { onCreated: (project: Project) => void }) {
  const create = useCreateProject();
  const [rows, setRows] = useState<BuildingRow[]>([]);
  const extraValues = useMemo(() => ({ buildings: buildingsBody(rows) }), [rows]);
  const form = useSchemaForm({
    schema: createProjectBodySchema,
    extraValues,
    onSubmit: async (values) => onCreated(await create.mutateAsync(values)),
  });
  return (
    <Form form={form} label="New site" className="space-y-6">
      <SiteFields />
      <Card title="Buildings">
        <BuildingsEditor rows={rows} onChange={setRows} />
      </Card>
      <SubmitButton size="lg">Create the site</SubmitButton>
    </Form>
  );
}

/** Changes to a site; the buildings list, when sent, replaces the old one. */
export function EditProjectForm({ project, onSaved }: { project: Project; onSaved: (project: Project) => void }) {
  const update = useUpdateProject(project.id);
  const [rows, setRows] = useState<BuildingRow[]>(() => initialRows(project));
  const extraValues = useMemo(() => ({ buildings: buildingsBody(rows), revision: project.revision }), [rows, project.revision]);
  const form = useSchemaForm({
    schema: updateProjectBodySchema,
    extraValues,
    onSubmit: async (values) => onSaved(await update.mutateAsync(values)),
  });
  return (
    <Form form={form} label={`Edit ${project.name}`} className="space-y-6">
      <SiteFields project={project} />
      <Card title="Buildings">
        <BuildingsEditor rows={rows} onChange={setRows} />
      </Card>
      <SubmitButton size="lg">Save the changes</SubmitButton>
    </Form>
  );
}
