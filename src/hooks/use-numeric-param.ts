import { useParams } from 'react-router-dom';

/** A positive whole-number id from the URL, or null when the segment is not one (which the page treats as not found). */
export function useNumericParam(name: string): number | null {
  const value = useParams()[name];
  if (!value || !/^[1-9]\d{0,15}$/.test(value)) return null;
  return Number(value);
}
