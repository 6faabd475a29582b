import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { ApiError } from '../../lib/api-client';
import { FieldGroup, Form, RadioGroupField, SubmitButton, TextField } from './fields';
import { flattenFieldValues } from './server-errors';
import { useSchemaForm } from './use-schema-form';

/** An invented body: a site name, how it is unloaded and lines of whole packs, as a shared schema would be. */
const bodySchema = z.object({
  name: z.string().trim().min(1, { error: 'must not be empty' }),
  method: z.enum(['ground', 'roof']),
  lines: z.array(z.object({ quantity: z.number().int().min(1, { error: 'must be at least 1 pack' }) })).min(1),
});

/** The typed text read into that body by field path, as the feature form schemas do. */
const formSchema = z
  .record(z.string(), z.string())
  .transform((values) => ({
    name: values.name ?? '',
    method: values.method,
    lines: [0, 1, 2].map((i) => ({ quantity: Number(values[`lines.${i}.quantity`] ?? '') })),
  }))
  .pipe(bodySchema);

function LinesForm({ onSubmit }: { onSubmit: (body: z.output<typeof formSchema>) => Promise<unknown> }) {
  const form = useSchemaForm({ schema: formSchema, onSubmit });
  return (
    <Form form={form} label="Delivery">
      <TextField name="name" label="Site name" hint="As the driver will see it." />
      <RadioGroupField
        name="method"
        legend="How it comes off"
        options={[
          { value: 'ground', label: 'Ground' },
          { value: 'roof', label: 'Roof' },
        ]}
        defaultValue="ground"
      />
      <FieldGroup name="lines" legend="Lines">
        {[0, 1, 2].map((i) => (
          <TextField key={i} name={`lines.${i}.quantity`} label={`Packs on line ${i + 1}`} defaultValue="1" />
        ))}
      </FieldGroup>
      <SubmitButton>Send</SubmitButton>
    </Form>
  );
}

/** The text of the elements an input's aria-describedby points at, in order. */
const description = (element: HTMLElement) =>
  (element.getAttribute('aria-describedby') ?? '')
    .split(' ')
    .filter(Boolean)
    .map((id) => document.getElementById(id)?.textContent ?? `(missing #${id})`)
    .join(' | ');

describe('form fields', () => {
  it('labels each input, links its hint by aria-describedby, and sends the parsed body', async () => {
    const onSubmit = vi.fn(async (body: unknown) => body);
    render(<LinesForm onSubmit={onSubmit} />);
    const name = screen.getByLabelText('Site name');
    expect(description(name)).toBe('As the driver will see it.');
    expect(name.getAttribute('aria-invalid')).toBeNull();
    fireEvent.change(name, { target: { value: 'Harrowfield Plot 4' } });
    fireEvent.change(screen.getByLabelText('Packs on line 3'), { target: { value: '12' } });
    fireEvent.click(screen.getByLabelText('Roof'));
    fireEvent.click(screen.getByRole('button', { name: 'Send' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0]?.[0]).toEqual({ name: 'Harrowfield Plot 4', method: 'roof', lines: [{ quantity: 1 }, { quantity: 1 }, { quantity: 12 }] });
  });

  it('marks a field the schema refuses, adds its error after the hint, focuses it and sends nothing', async () => {
    const onSubmit = vi.fn(async () => undefined);
    render(<LinesForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText('Packs on line 2'), { target: { value: '0' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send' }));
    const name = screen.getByLabelText('Site name');
    await waitFor(() => expect(name.getAttribute('aria-invalid')).toBe('true'));
    expect(description(name)).toBe('As the driver will see it. | must not be empty');
    const line2 = screen.getByLabelText('Packs on line 2');
    expect(line2.getAttribute('aria-invalid')).toBe('true');
    expect(description(line2)).toBe('must be at least 1 pack');
    expect(document.activeElement).toBe(name);
    expect(onSubmit).not.toHaveBeenCalled();
    // Typing a good value takes the mark off that field alone.
    fireEvent.change(name, { target: { value: 'Harrowfield Plot 4' } });
    await waitFor(() => expect(name.getAttribute('aria-invalid')).toBeNull());
    expect(line2.getAttribute('aria-invalid')).toBe('true');
  });

  it('puts a 422’s field errors under their fields by path, nested ones too, announces them and focuses the first', async () => {
    const onSubmit = vi.fn(async () => {
      throw new ApiError(422, 'validation_failed', 'The request has 2 problems', [
        { path: 'lines.2.quantity', message: 'is more than the branch has free (8 packs)' },
        { path: 'name', message: 'is already a site of yours' },
      ]);
    });
    render(<LinesForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText('Site name'), { target: { value: 'Harrowfield Plot 4' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send' }));
    const line3 = screen.getByLabelText('Packs on line 3');
    await waitFor(() => expect(line3.getAttribute('aria-invalid')).toBe('true'));
    expect(description(line3)).toBe('is more than the branch has free (8 packs)');
    expect(description(screen.getByLabelText('Site name'))).toBe('As the driver will see it. | is already a site of yours');
    expect(screen.getByLabelText('Packs on line 1').getAttribute('aria-invalid')).toBeNull();
    // Announced: the form's alert says to look at the fields, and focus lands on the first one named.
    expect(screen.getByRole('alert').textContent).toContain('Check the fields marked below.');
    expect(document.activeElement).toBe(line3);
  });

  it('shows a detail naming no field here, and any other refusal, in the form’s alert with the server’s words', async () => {
    const errors = [
      new ApiError(422, 'validation_failed', 'The request has 1 problem', [{ path: 'branch_id', message: 'is not one of your branches' }]),
      new ApiError(409, 'slot_full', 'The lorry is full on that day'),
      new Error('network down'),
    ];
    const onSubmit = vi.fn(async () => {
      throw errors.shift();
    });
    render(<LinesForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText('Site name'), { target: { value: 'Harrowfield Plot 4' } });
    const send = () => fireEvent.click(screen.getByRole('button', { name: 'Send' }));
    send();
    await waitFor(() => expect(screen.getByRole('alert').textContent).toContain('branch_id: is not one of your branches'));
    send();
    await waitFor(() => expect(screen.getByRole('alert').textContent).toContain('The lorry is full on that day'));
    send();
    await waitFor(() => expect(screen.getByRole('alert').textContent).toContain('Something went wrong. Try again in a moment.'));
    expect(onSubmit).toHaveBeenCalledTimes(3);
  });

  it('shows an error about a whole group under its legend, linked to the fieldset', async () => {
    const onSubmit = vi.fn(async () => {
      throw new ApiError(422, 'validation_failed', 'The request has 1 problem', [{ path: 'lines', message: 'has more lines than one lorry carries' }]);
    });
    render(<LinesForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText('Site name'), { target: { value: 'Harrowfield Plot 4' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send' }));
    const group = await screen.findByRole('group', { name: 'Lines' });
    await waitFor(() => expect(description(group)).toBe('has more lines than one lorry carries'));
  });
});

describe('flattenFieldValues', () => {
  it('gives the values by field path as a browser posts a form: ticks as "on", unticked and unchosen left out', () => {
    expect(flattenFieldValues({ name: 'Plot 4', lines: [{ quantity: '3' }, undefined, { quantity: '5' }], crane: true, roof: false, method: null, weekday: [undefined, true] })).toEqual({
      name: 'Plot 4',
      'lines.0.quantity': '3',
      'lines.2.quantity': '5',
      crane: 'on',
      'weekday.1': 'on',
    });
  });
});
