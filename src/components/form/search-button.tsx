import type { ReactNode } from 'react';
import { Button } from '../ui/button';

/** The Search button that ends a list's search bar (typed words search on it or on Enter), with the bar's "clear the filters" link, if any, after it. */
export function SearchButton({ clear }: { clear?: ReactNode }) {
  return (
    <>
      <Button type="submit" variant="secondary">
        Search
      </Button>
      {clear}
    </>
  );
}
