/**
 * Starledger's mark: a four-pointed star set on a ruled line, the name in
 * the serif. Drawn here so it follows the theme's ink.
 */
export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className ?? ''}`}>
      <svg aria-hidden="true" viewBox="0 0 24 24" className="size-6 text-brass" fill="currentColor">
        <path d="M12 1.5 13.6 10.4 22.5 12 13.6 13.6 12 22.5 10.4 13.6 1.5 12 10.4 10.4Z" />
        <rect x="1" y="22" width="22" height="1" />
      </svg>
      <span className="font-serif text-xl font-semibold tracking-wide text-ink">Starledger</span>
    </span>
  );
}
