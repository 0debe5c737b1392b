/** How a pipeline uses a token, with this server's own address. */
export function CurlExample({ origin }: { origin: string }) {
  const lines = [
    '# the token shown once when you created it',
    "export STARLEDGER_TOKEN='<token>'",
    '',
    '# your projects',
    `curl -s -H "Authorization: Bearer $STARLEDGER_TOKEN" ${origin}/api/projects`,
    '',
    '# send a night’s file to project 1 for preview, then commit the upload id it answers with',
    `curl -s -H "Authorization: Bearer $STARLEDGER_TOKEN" -F file=@night.csv ${origin}/api/projects/1/uploads`,
    `curl -s -H "Authorization: Bearer $STARLEDGER_TOKEN" -H 'Content-Type: application/json' -d '{}' \\`,
    `  ${origin}/api/projects/1/uploads/UPLOAD_ID/commit`,
  ];
  return (
    // Wider than a phone: a named region in the tab order, so the keyboard can scroll it (WCAG 2.1.1).
    <pre
      tabIndex={0}
      role="region"
      aria-label="Example: calling the API with a token"
      className="overflow-x-auto rounded-sm border border-rule bg-paper-deep px-4 py-3 font-mono text-xs leading-relaxed focus-visible:outline-2"
      data-testid="curl-example"
    >
      {lines.join('\n')}
    </pre>
  );
}
