import type { ReactNode } from 'react';
import { cx } from '@/lib/class-names';
import { Button } from './button';
import { SearchField } from './search-field';

/**
 * The filters above a paged list, as one search landmark named `label`: a search box first when
 * `search` is given, then `children` (the choices), then "Clear filters", which is off while no
 * filter is set. `columns` lays them out from the md breakpoint on (two columns below it, the
 * first field across both).
 */
export function FilterBar({
  label,
  columns,
  search,
  filtered,
  onClear,
  children,
}: {
  label: string;
  columns: string;
  search?: { label: string; value: string; onChange: (value: string) => void; placeholder?: string };
  filtered: boolean;
  onClear: () => void;
  children: ReactNode;
}) {
  return (
    <div role="search" aria-label={label} className={cx('grid grid-cols-2 items-end gap-3', columns)}>
      {search ? <SearchField {...search} className="col-span-2 md:col-span-1" /> : null}
      {children}
      <Button variant="quiet" disabled={!filtered} onClick={onClear} className="justify-self-start">
        Clear filters
      </Button>
    </div>
  );
}
