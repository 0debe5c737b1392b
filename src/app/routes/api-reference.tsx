import { PageHeader, Section } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { linkClasses } from '@/components/ui/button';
import { QueryError } from '@/components/errors/query-error';
import { useOpenApi, type ApiOperation } from '@/features/api-reference/api/get-openapi';
import { ApiOperationEntry } from '@/features/api-reference/components/api-operation';

/** The API described, for people writing pipelines: read from the OpenAPI document the server generates, grouped by part. */
export function ApiReferenceRoute() {
  const doc = useOpenApi();
  const groups = new Map<string, { method: string; path: string; op: ApiOperation }[]>();
  for (const [path, methods] of Object.entries(doc.data?.paths ?? {})) {
    for (const [method, op] of Object.entries(methods)) {
      const tag = op.tags[0] ?? 'Other';
      groups.set(tag, [...(groups.get(tag) ?? []), { method, path, op }]);
    }
  }
  return (
    <>
      <title>API reference · Starledger</title>
      <PageHeader
        eyebrow="For pipelines"
        title="API reference"
        description={
          <>
            Every route of the Starledger API with who may call it, what it takes and the errors it answers. Errors share one shape,{' '}
            <code>{'{ error: { code, message, details? } }'}</code>: programs read the code. The same description as an OpenAPI 3.1 document, for
            generating clients:{' '}
            <a className={linkClasses} href="/api/openapi.json" download="starledger-openapi.json">
              openapi.json
            </a>
            .
          </>
        }
      />
      {doc.isPending ? <StatusLine>Loading the API description…</StatusLine> : null}
      {doc.isError ? <QueryError what="The API description" error={doc.error} onRetry={() => void doc.refetch()} /> : null}
      {[...groups].map(([tag, operations]) => (
        <Section key={tag} title={tag} className="mt-8">
          {operations.map((o) => (
            <ApiOperationEntry key={`${o.method} ${o.path}`} {...o} />
          ))}
        </Section>
      ))}
    </>
  );
}
