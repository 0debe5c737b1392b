import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';
import { Button } from './button';
import { SelectField } from './field';

/**
 * The row under a paged list: an optional count line, the page-size choice
 * and the two page buttons. Each list keeps its own words (what a page holds,
 * which way is "previous"), so they come in as props.
 */
export function Pager({
  label,
  summary,
  page,
  pageCount,
  onPage,
  pageSize,
  pageSizes,
  onPageSize,
  pageSizeLabel,
  pageSizeClassName = 'w-36',
  previousLabel = 'Previous page',
  nextLabel = 'Next page',
  className,
}: {
  /** The navigation landmark's accessible name, e.g. "Pages of the trail". */
  label: string;
  /** The count line ("120 entries · page 1 of 5"), announced as it changes; left out where the list says it above. */
  summary?: ReactNode;
  page: number;
  pageCount: number;
  onPage: (page: number) => void;
  pageSize: number;
  pageSizes: readonly number[];
  onPageSize: (pageSize: number) => void;
  pageSizeLabel: string;
  pageSizeClassName?: string;
  previousLabel?: string;
  nextLabel?: string;
  className?: string;
}) {
  return (
    <nav
      aria-label={label}
      className={cn('flex flex-wrap items-end gap-4 text-sm', summary === undefined ? 'justify-end' : 'justify-between', className)}
      data-print="hide"
    >
      {summary === undefined ? null : (
        <p className="pb-2 text-ink-soft" aria-live="polite">
          {summary}
        </p>
      )}
      {/* Without a count line the controls sit at the right, and stay there when they wrap on a narrow screen. */}
      <div className={cn('flex flex-wrap items-end gap-3', summary === undefined && 'justify-end')}>
        <SelectField label={pageSizeLabel} value={pageSize} onChange={(e) => onPageSize(Number(e.target.value))} className={pageSizeClassName}>
          {pageSizes.map((size) => (
            <option key={size} value={size}>
              {size}
            </option>
          ))}
        </SelectField>
        <Button variant="secondary" disabled={page <= 1} onClick={() => onPage(page - 1)}>
          {previousLabel}
        </Button>
        <Button variant="secondary" disabled={page >= pageCount} onClick={() => onPage(page + 1)}>
          {nextLabel}
        </Button>
      </div>
    </nav>
  );
}
