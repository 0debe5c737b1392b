import type { Upload } from '@shared/schemas/uploads';

/** An upload's status as a word, never as a colour alone. */
export const UPLOAD_STATUS_WORDS: Readonly<Record<Upload['status'], string>> = {
  previewed: 'Previewed, not imported',
  committed: 'Committed',
  discarded: 'Discarded',
};

export const UPLOAD_KIND_WORDS: Readonly<Record<Upload['kind'], string>> = {
  measurements: 'Measurements',
  spectrum: 'Spectrum',
};

/** File sizes the way a person reads them: 812 B, 14.2 kB, 3.1 MB (powers of 1000). */
export function formatBytes(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(1)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}
