import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import type { ApiOperation, JsonSchema } from '../api/get-openapi';
import { schemaWords } from './schema-words';

interface Field {
  name: string;
  where: string;
  required: boolean;
  schema: JsonSchema;
}

/** The parameters and body fields of an operation, in one list. */
function fieldsOf(op: ApiOperation): Field[] {
  const fields: Field[] = (op.parameters ?? []).map((p) => ({ name: p.name, where: p.in, required: p.required === true, schema: p.schema }));
  for (const [media, { schema }] of Object.entries(op.requestBody?.content ?? {})) {
    const where = media === 'multipart/form-data' ? 'form' : 'body';
    for (const [name, field] of Object.entries(schema.properties ?? {})) fields.push({ name, where, required: schema.required?.includes(name) ?? false, schema: field });
  }
  return fields;
}

/** One operation of the API: method and path, who may call it, what it takes, and the errors it answers. */
export function ApiOperationEntry({ method, path, op }: { method: string; path: string; op: ApiOperation }) {
  const fields = fieldsOf(op);
  const errors = Object.entries(op.responses).filter(([status]) => Number(status) >= 400);
  return (
    <article className="border-t border-rule py-5" id={op.operationId}>
      <h3 className="font-mono text-sm break-all">
        <span className="mr-2 font-semibold text-brass-deep uppercase">{method}</span>
        /api{path}
      </h3>
      {op.description ? <p className="mt-1 text-sm text-ink-soft">{op.description}</p> : null}
      {fields.length > 0 ? (
        <LedgerTable aria-label={`Fields of ${method.toUpperCase()} ${path}`} className="mt-3">
          <LedgerHead>
            <LedgerRow>
              <LedgerHeaderCell scope="col">Name</LedgerHeaderCell>
              <LedgerHeaderCell scope="col">In</LedgerHeaderCell>
              <LedgerHeaderCell scope="col">Required</LedgerHeaderCell>
              <LedgerHeaderCell scope="col">Type</LedgerHeaderCell>
            </LedgerRow>
          </LedgerHead>
          <LedgerBody>
            {fields.map((f) => (
              <LedgerRow key={`${f.where}:${f.name}`}>
                <LedgerCell className="font-mono">{f.name}</LedgerCell>
                <LedgerCell>{f.where}</LedgerCell>
                <LedgerCell>{f.required ? 'yes' : 'no'}</LedgerCell>
                <LedgerCell className="break-words">{schemaWords(f.schema)}</LedgerCell>
              </LedgerRow>
            ))}
          </LedgerBody>
        </LedgerTable>
      ) : (
        <p className="mt-2 text-sm text-ink-soft">Takes no parameters.</p>
      )}
      <details className="mt-3 text-sm">
        <summary className="cursor-pointer text-brass">Errors it may answer ({errors.length})</summary>
        <ul className="mt-2 space-y-1">
          {errors.map(([status, r]) => (
            <li key={status}>
              <span className="font-mono font-semibold">{status}</span> {r.description}
            </li>
          ))}
        </ul>
      </details>
    </article>
  );
}
