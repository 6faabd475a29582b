import { useEffect } from 'react';
import { useWatch } from 'react-hook-form';
import { projectSearchSchema } from '../../../../shared/schemas/list-search.schema';
import type { ProjectSearch } from '../../../../shared/schemas/list-search.schema';
import { CheckboxField, Form, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Spinner } from '../../../components/ui/spinner';

interface SiteSearchProps {
  /** The search as the schema reads it, each time it changes (the words before any pause in typing). */
  onSearch: (search: ProjectSearch) => void;
  /** A box was changed: the list goes back to its first page. */
  onFilterChange: () => void;
  /** The list is being asked for again. */
  updating: boolean;
}

/**
 * The sites' search bar, loaded (with the form library) after the list. The list follows the search as
 * it is typed and the tick box at once, both read through the search schema; Enter only checks the
 * words, which are already applied.
 */
export function SiteSearch({ onSearch, onFilterChange, updating }: SiteSearchProps) {
  const form = useSchemaForm({ schema: projectSearchSchema, onSubmit: () => undefined });
  const { control, trigger } = form.methods;
  const typed = useWatch({ control, name: 'q' }) as string | undefined;
  const ticked = useWatch({ control, name: 'archived' }) as boolean | undefined;
  const read = projectSearchSchema.safeParse({ q: typed ?? '', archived: ticked ? 'on' : undefined });
  const q = read.success ? read.data.q : undefined;
  const archived = read.success ? read.data.archived : ticked ? ('all' as const) : ('false' as const);
  useEffect(() => onSearch({ q, archived }), [q, archived, onSearch]);
  const changed = () => {
    onFilterChange();
    void trigger('q');
  };
  return (
    <Form form={form} label="Find sites" role="search" className="flex flex-wrap items-end gap-4">
      <TextField name="q" label="Search sites" type="search" maxLength={100} placeholder="Name, reference, address or contact" className="min-w-60 flex-1" onChange={changed} />
      <CheckboxField name="archived" label="Include archived sites" onChange={changed} />
      {updating ? <Spinner label="Updating the list" /> : null}
    </Form>
  );
}
