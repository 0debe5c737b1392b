/** Tags as small ruled labels. */
export function TagList({ tags, label = 'Tags' }: { tags: readonly string[]; label?: string }) {
  if (tags.length === 0) return null;
  return (
    <ul aria-label={label} className="flex flex-wrap gap-1.5">
      {tags.map((tag) => (
        <li key={tag} className="rounded-sm border border-rule px-1.5 py-0.5 text-xs text-ink-soft">
          {tag}
        </li>
      ))}
    </ul>
  );
}
