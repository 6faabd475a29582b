import { useEffect, useRef } from 'react';
import { useWatch } from 'react-hook-form';
import * as z from 'zod/mini';
import { flattenFieldValues } from './server-errors';
import { useSchemaForm } from './use-schema-form';
import type { SchemaForm } from './use-schema-form';

interface ListSearchFormOptions<TSchema extends z.core.$ZodType> {
  /** The search schema from shared/schemas/list-search.schema.ts. */
  schema: TSchema;
  /** The values the list's address holds, by field name (text as the inputs show it; a tick box as a boolean). */
  address: Record<string, string | boolean>;
  onSearch: (values: z.output<TSchema>) => void;
}

/**
 * A list's search bar on the one form pattern. The list's address holds its filters: the inputs start
 * from it (their `defaultValue`) and follow it when it changes from outside (Back, Forward, "Clear the
 * filters"), while words typed and not yet searched for stay in their box. `searchNow` submits the bar
 * through its schema: a choice (a select, a tick box) searches at once, typed words on Enter or Search.
 */
export function useListSearchForm<TSchema extends z.core.$ZodType>({ schema, address, onSearch }: ListSearchFormOptions<TSchema>): { form: SchemaForm; searchNow: () => void } {
  const form = useSchemaForm({ schema, onSubmit: onSearch });
  const { setValue } = form.methods;
  const previous = useRef(address);
  useEffect(() => {
    for (const [name, value] of Object.entries(address)) {
      if (previous.current[name] !== value) setValue(name, value);
    }
    previous.current = address;
  });
  const { submit } = form;
  return { form, searchNow: () => void submit() };
}

/**
 * A filter bar the list follows as it changes, with nothing to press (a view's selects and tick
 * boxes): the form's values read through its schema on every change. Until the inputs have
 * registered, or should they hold something the schema refuses, the list shows `fallback`.
 */
export function useLiveFilterForm<TSchema extends z.core.$ZodType>(schema: TSchema, fallback: z.output<TSchema>): { form: SchemaForm; filters: z.output<TSchema> } {
  const form = useSchemaForm({ schema, onSubmit: () => undefined });
  const watched = useWatch({ control: form.methods.control });
  const read = z.safeParse(schema, flattenFieldValues(watched));
  return { form, filters: read.success ? read.data : fallback };
}
