import { useId } from 'react';
import { useTheme } from '@/lib/theme';
import { cn } from '@/lib/cn';

/** Switches the deep-red night theme for work at the telescope; the choice is remembered on this device. */
export function ThemeToggle({ className }: { className?: string }) {
  const { theme, toggleTheme } = useTheme();
  const night = theme === 'night';
  return (
    <button
      type="button"
      aria-pressed={night}
      onClick={toggleTheme}
      className={cn(
        'inline-flex items-center gap-2 rounded-sm border border-rule px-2.5 py-1 text-sm text-ink hover:bg-paper-deep',
        className,
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4" fill="currentColor">
        <path d="M10.5 1.2A6.8 6.8 0 1 0 14.8 11 5.6 5.6 0 0 1 10.5 1.2Z" />
      </svg>
      Night theme
      <span aria-hidden="true" className="text-xs text-ink-soft">{night ? 'on' : 'off'}</span>
    </button>
  );
}

const DIM_HINT =
  'Lowers the whole screen to 60 % brightness for the eyepiece. Dimmed text is about 2.4:1 against the black, below the 4.5:1 the night theme otherwise keeps: your choice at the telescope.';

/** The night theme's dimmer, offered only at night; remembered on this device like the theme. */
export function DimToggle({ className }: { className?: string }) {
  const { theme, dim, toggleDim } = useTheme();
  const hintId = useId();
  if (theme !== 'night') return null;
  return (
    <>
      <button
        type="button"
        aria-pressed={dim}
        aria-describedby={hintId}
        title={DIM_HINT}
        onClick={toggleDim}
        className={cn('inline-flex items-center gap-2 rounded-sm border border-rule px-2.5 py-1 text-sm text-ink hover:bg-paper-deep', className)}
      >
        Dim
        <span aria-hidden="true" className="text-xs text-ink-soft">{dim ? 'on' : 'off'}</span>
      </button>
      <span id={hintId} className="sr-only">
        {DIM_HINT}
      </span>
    </>
  );
}
