import { useLocation } from 'react-router-dom';

/** The token of a link from a mail, carried after “#” so that it never reaches a server log or a Referer header. */
export function useLinkToken(): string {
  return decodeURIComponent(useLocation().hash.replace(/^#/, '')).trim();
}
