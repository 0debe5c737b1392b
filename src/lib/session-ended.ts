import { useSyncExternalStore } from 'react';

/*
 * When a session ends under a signed-in page (30 minutes unused, 12 hours
 * after sign-in, ended from another browser) the next request is a 401. The
 * app shell then either goes to sign-in at once, saying why and coming back
 * afterwards, or, when something was typed on the page and not saved, stays
 * and says so first: an observer's half-written note must not vanish
 * without a word. This module holds the reason and whether anything is typed.
 */

let endedMessage: string | null = null;
const listeners = new Set<() => void>();

function notify() {
  for (const listener of listeners) listener();
}

export const SESSION_ENDED_FALLBACK = 'Your session has ended. Sign in again.';

export function reportSessionEnded(message: string): void {
  if (endedMessage === message) return;
  endedMessage = message;
  notify();
}

/** Whether a session had been reported ended. */
export function clearSessionEnded(): boolean {
  if (endedMessage === null) return false;
  endedMessage = null;
  notify();
  return true;
}

export function useSessionEnded(): string | null {
  return useSyncExternalStore(
    (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    () => endedMessage,
  );
}

/* Typing anywhere on the page since it was opened or last saved. */
let typed = false;
let watching = false;

/** Starts noticing typing (once); the app shell calls it. */
export function watchTyping(): void {
  if (watching) return;
  watching = true;
  document.addEventListener('input', () => (typed = true), true);
}

/** A page was left or something was saved: nothing typed is waiting. */
export function forgetTyping(): void {
  typed = false;
}

export function hasUnsavedTyping(): boolean {
  return typed;
}
