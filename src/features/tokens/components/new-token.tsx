import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import type { CreatedToken } from '../api/create-token';

/**
 * The one time a token's text is shown. The server keeps only a hash, so
 * the page says plainly that it cannot be shown again.
 */
export function NewToken({ created, onDone }: { created: CreatedToken; onDone: () => void }) {
  const [copied, setCopied] = useState<'yes' | 'failed' | null>(null);

  async function copy() {
    try {
      await navigator.clipboard.writeText(created.token);
      setCopied('yes');
    } catch {
      // Clipboard access needs a secure context and permission; selecting the text by hand still works.
      setCopied('failed');
    }
  }

  return (
    <Alert kind="done" title={`Token “${created.apiToken.name}” created.`} className="mb-6">
      <p className="font-semibold">Copy it now: it will not be shown again. Starledger keeps only a fingerprint of it.</p>
      <div className="mt-2 flex flex-wrap items-center gap-3">
        <label htmlFor="new-token" className="sr-only">
          The new token
        </label>
        <input
          id="new-token"
          readOnly
          value={created.token}
          onFocus={(e) => e.currentTarget.select()}
          className="w-full max-w-xl rounded-sm border border-rule bg-paper px-3 py-2 font-mono text-sm"
          data-testid="new-token"
        />
        <Button variant="secondary" size="sm" onClick={() => void copy()}>
          Copy token
        </Button>
        <Button variant="quiet" size="sm" onClick={onDone}>
          I have stored it
        </Button>
      </div>
      <p className="mt-1 text-sm" aria-live="polite">
        {copied === 'yes' ? 'Copied to the clipboard.' : copied === 'failed' ? 'The browser refused the clipboard; select the text and copy it by hand.' : ''}
      </p>
      <p className="mt-2 text-sm">
        Anyone holding it acts as you, with your roles in every project, until you revoke it. Keep it in the pipeline’s secret store, not in
        a script under version control.
      </p>
    </Alert>
  );
}
