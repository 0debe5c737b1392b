import type { Page } from 'playwright-core';

export interface CaughtLink {
  /** The message's id in the mail fake (the caught-mail page opens it by id). */
  id: number;
  /** The link's path and fragment, to open on the test server (the mail names PUBLIC_URL, which may be another host name for it). */
  path: string;
  html: string;
  text: string;
  subject: string;
}

/**
 * Waits until the local mail fake has caught a message to `to` carrying a
 * link to `page` (the outbox worker sends every couple of seconds), and
 * returns the link and the message, read through the site admin's API.
 */
export async function linkFromMail(admin: Page, to: string, linkPage: 'invitation' | 'reset-password', timeoutMs = 20_000): Promise<CaughtLink> {
  const pattern = new RegExp(`https?://[^\\s"<]+/${linkPage}#[A-Za-z0-9_-]+`);
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const found = await admin.evaluate(
      async ({ to, source }) => {
        const list = (await (await fetch('/api/admin/mail')).json()) as { messages: { id: number; to: string[] }[] };
        for (const m of list.messages.filter((x) => x.to.includes(to))) {
          const { message: body } = (await (await fetch(`/api/admin/mail/${m.id}`)).json()) as { message: { text: string; html: string | null; subject: string } };
          const link = new RegExp(source).exec(body.text)?.[0];
          if (link) return { id: m.id, link, html: body.html ?? '', text: body.text, subject: body.subject };
        }
        return null;
      },
      { to, source: pattern.source },
    );
    if (found) {
      const url = new URL(found.link);
      return { id: found.id, path: `${url.pathname}${url.hash}`, html: found.html, text: found.text, subject: found.subject };
    }
    await admin.waitForTimeout(500);
  }
  throw new Error(`no ${linkPage} link to ${to} reached the mail fake within ${timeoutMs} ms`);
}

/** A write from a signed-in page through the API, with the session's CSRF token. */
export async function apiWrite(page: Page, method: 'POST' | 'DELETE', path: string, body?: unknown): Promise<{ status: number; body: unknown }> {
  return page.evaluate(
    async ({ method, path, body }) => {
      const me = (await (await fetch('/api/auth/me')).json()) as { csrfToken?: string };
      const res = await fetch(`/api${path}`, {
        method,
        headers: { 'Content-Type': 'application/json', ...(me.csrfToken ? { 'X-CSRF-Token': me.csrfToken } : {}) },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      return { status: res.status, body: res.status === 204 ? null : await res.json() };
    },
    { method, path, body },
  );
}
