import { useEffect, useRef, useState, type ComponentProps } from 'react';
import { cn } from '@/lib/cn';

/*
 * Tables drawn as ledger pages: ruled lines between entries, a heavier rule
 * under the column heads, figures right-aligned in tabular digits.
 */

/**
 * Whether the element's content is wider than the element, and whether more
 * of it lies hidden before or after the part in view, kept up to date as
 * either resizes or the box scrolls.
 */
function useOverflowsSideways() {
  const ref = useRef<HTMLDivElement>(null);
  const [state, setState] = useState({ overflows: false, moreBefore: false, moreAfter: false });
  useEffect(() => {
    const box = ref.current;
    if (!box) return;
    const measure = () => {
      const overflows = box.scrollWidth > box.clientWidth + 1;
      const moreBefore = overflows && box.scrollLeft > 1;
      const moreAfter = overflows && box.scrollLeft + box.clientWidth < box.scrollWidth - 1;
      setState((s) => (s.overflows === overflows && s.moreBefore === moreBefore && s.moreAfter === moreAfter ? s : { overflows, moreBefore, moreAfter }));
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(box);
    if (box.firstElementChild) observer.observe(box.firstElementChild);
    box.addEventListener('scroll', measure, { passive: true });
    return () => {
      observer.disconnect();
      box.removeEventListener('scroll', measure);
    };
  }, []);
  return { ref, ...state };
}

/** A shade at an edge of a scrolling box behind which more columns lie; drawn only, never read out. */
function EdgeShade({ side }: { side: 'before' | 'after' }) {
  return (
    <div
      aria-hidden="true"
      data-print="hide"
      data-edge-shade={side}
      className={cn(
        'pointer-events-none absolute inset-y-0 w-6 from-ink/25 to-transparent',
        side === 'before' ? 'left-0 bg-linear-to-r' : 'right-0 bg-linear-to-l',
      )}
    />
  );
}

/**
 * A table wider than the screen scrolls inside its own box. Only then is
 * the box a named region in the tab order (so the keyboard can scroll it with
 * the arrow keys, WCAG 2.1.1) with a line saying that it scrolls; a table
 * that fits adds no tab stop.
 */
export function LedgerTable({ className, ...props }: ComponentProps<'table'>) {
  const { ref, overflows, moreBefore, moreAfter } = useOverflowsSideways();
  const label = props['aria-label'];
  return (
    <div>
      {overflows ? (
        <p className="mb-1 text-xs text-ink-soft" data-print="hide">
          Wider than the screen: scroll sideways for more columns{label ? '' : '.'}
          {label ? ` (focus the table “${label}” and use the arrow keys).` : null}
        </p>
      ) : null}
      <div className="relative">
        <div
          ref={ref}
          // Positioned, so absolutely placed text inside cells (sr-only words) scrolls with the table instead of widening the page.
          className="relative overflow-x-auto focus-visible:outline-2"
          {...(overflows ? { tabIndex: 0, role: 'region', 'aria-label': label ? `${label}, scrolls sideways` : 'Table, scrolls sideways' } : {})}
        >
          <table className={cn('w-full border-collapse text-sm', className)} {...props} />
        </div>
        {moreBefore ? <EdgeShade side="before" /> : null}
        {moreAfter ? <EdgeShade side="after" /> : null}
      </div>
    </div>
  );
}

export function LedgerHead(props: ComponentProps<'thead'>) {
  return <thead className="border-b-2 border-ink-soft" {...props} />;
}

export function LedgerBody(props: ComponentProps<'tbody'>) {
  return <tbody {...props} />;
}

export function LedgerRow({ className, ...props }: ComponentProps<'tr'>) {
  return <tr className={cn('border-b border-rule hover:bg-paper-deep/60', className)} {...props} />;
}

export function LedgerHeaderCell({ className, numeric, ...props }: ComponentProps<'th'> & { numeric?: boolean }) {
  return (
    <th
      className={cn(
        'px-3 py-2 text-xs font-semibold tracking-wide text-ink-soft',
        numeric ? 'text-right' : 'text-left',
        className,
      )}
      {...props}
    />
  );
}

export function LedgerCell({ className, numeric, ...props }: ComponentProps<'td'> & { numeric?: boolean }) {
  return <td className={cn('px-3 py-2 align-baseline', numeric && 'text-right tabular-nums whitespace-nowrap', className)} {...props} />;
}
