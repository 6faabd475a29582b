import { useId } from 'react';

export interface BranchOption {
  id: number;
  name: string;
  town: string;
}

/** The branch picker of the merchant's boards: one branch at a time. */
export function BranchSelect({ branches, value, onChange }: { branches: readonly BranchOption[]; value: number; onChange: (branchId: number) => void }) {
  const selectId = useId();
  return (
    <div>
      <label htmlFor={selectId} className="mb-1 block font-medium">
        Branch
      </label>
      <select id={selectId} value={value} onChange={(e) => onChange(Number(e.target.value))} className="block min-h-tap rounded-md border border-ink-300 bg-white px-2">
        {branches.map((b) => (
          <option key={b.id} value={b.id}>
            {b.name}, {b.town}
          </option>
        ))}
      </select>
    </div>
  );
}
