import { useEffect, useRef, useState, type ComponentProps } from 'react';
import { cn } from '@/lib/cn';

/*
 * Tables drawn as ledger pages: ruled lines between entries, a heavier rule
 * under the column heads, figures right-aligned in tabular digits.
 */

/** Whether the element's content is wider than the element, kept up to date as either resizes. */
function useOverflowsSideways() {
  const ref = useRef<HTMLDivElement>(null);
  const [overflows, setOverflows] = useState(false);
  useEffect(() => {
    const box = ref.current;
    if (!box) return;
    const measure = () => setOverflows(box.scrollWidth > box.clientWidth + 1);
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(box);
    if (box.firstElementChild) observer.observe(box.firstElementChild);
    return () => observer.disconnect();
  }, []);
  return { ref, overflows };
}

/**
 * A table wider than the screen scrolls inside its own box. Only then is
 * the box a named region in the tab order (so the keyboard can scroll it with
 * the arrow keys, WCAG 2.1.1) with a line saying that it scrolls; a table
 * that fits adds no tab stop.
 */
export function LedgerTable({ className, ...props }: ComponentProps<'table'>) {
  const { ref, overflows } = useOverflowsSideways();
  const label = props['aria-label'];
  return (
    <div>
      {overflows ? (
        <p className="mb-1 text-xs text-ink-soft" data-print="hide">
          Wider than the screen: scroll sideways for more columns{label ? '' : '.'}
          {label ? ` (focus the table “${label}” and use the arrow keys).` : null}
        </p>
      ) : null}
      <div
        ref={ref}
        className="overflow-x-auto focus-visible:outline-2"
        {...(overflows ? { tabIndex: 0, role: 'region', 'aria-label': label ? `${label}, scrolls sideways` : 'Table, scrolls sideways' } : {})}
      >
        <table className={cn('w-full border-collapse text-sm', className)} {...props} />
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
