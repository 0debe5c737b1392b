import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';

const FILE_NAME = 'starledger-recovery-codes.txt';

/**
 * The recovery codes, shown this once (the server keeps only their hashes),
 * with a way to copy them and to save them as a text file, and a button to
 * say they are kept.
 */
export function RecoveryCodes({ codes, account, message, onDone }: { codes: string[]; account: string; message: string; onDone: () => void }) {
  const [copied, setCopied] = useState<string | null>(null);
  const text = `Starledger recovery codes for ${account}\nEach signs in once instead of a code from the authenticator app.\n\n${codes.join('\n')}\n`;

  const copy = async () => {
    try {
      await navigator.clipboard.writeText(text);
      setCopied('Copied. Paste them somewhere safe, such as a password manager.');
    } catch {
      setCopied('This browser did not allow copying; select the codes and copy them, or download them.');
    }
  };

  const download = () => {
    const url = URL.createObjectURL(new Blob([text], { type: 'text/plain;charset=utf-8' }));
    const a = document.createElement('a');
    a.href = url;
    a.download = FILE_NAME;
    a.click();
    URL.revokeObjectURL(url);
  };

  return (
    <div className="space-y-3">
      <Alert kind="done" title={message} />
      <ol aria-label="Recovery codes" className="grid max-w-md grid-cols-2 gap-x-6 gap-y-1 rounded-sm border border-rule bg-paper-deep px-4 py-3 font-mono text-base tracking-wider text-ink" data-testid="recovery-codes">
        {codes.map((code) => (
          <li key={code}>{code}</li>
        ))}
      </ol>
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" size="sm" onClick={() => void copy()}>
          Copy the codes
        </Button>
        <Button variant="secondary" size="sm" onClick={download}>
          Download as {FILE_NAME}
        </Button>
        <Button size="sm" onClick={onDone}>
          I have kept them
        </Button>
      </div>
      <p role="status" className="text-sm text-ink-soft">
        {copied}
      </p>
    </div>
  );
}
