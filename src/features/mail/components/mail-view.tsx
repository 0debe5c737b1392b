import { Section } from '@/components/ui/page-header';

/**
 * A message as its reader's mail program would draw it, and as plain text.
 * The HTML goes into a sandboxed frame with no scripts, forms or same-origin
 * rights, so nothing in a message can act on Starledger's page.
 */
export function MailView({ subject, html, text }: { subject: string; html: string | null; text: string }) {
  return (
    <div className="space-y-8" data-testid="mail-view">
      {html !== null ? (
        <Section title="As HTML">
          {/* At night the message is inverted to dark and multiplied by pure red, so the frame keeps to red light like the rest of the page. */}
          <div className="relative">
            <iframe
              title={`The message “${subject}” as HTML`}
              sandbox=""
              srcDoc={html}
              className="block h-[36rem] w-full rounded-sm border border-rule bg-white [[data-theme=night]_&]:[filter:invert(1)_grayscale(1)]"
              data-testid="mail-html"
            />
            <div aria-hidden="true" className="pointer-events-none absolute inset-0 hidden rounded-sm bg-[#ff0000] mix-blend-multiply [[data-theme=night]_&]:block" />
          </div>
        </Section>
      ) : null}
      <Section title="As plain text">
        <pre className="max-h-[36rem] overflow-auto rounded-sm border border-rule bg-paper-deep px-4 py-3 font-mono text-xs leading-relaxed whitespace-pre-wrap" data-testid="mail-text" tabIndex={0}>
          {text}
        </pre>
      </Section>
    </div>
  );
}
