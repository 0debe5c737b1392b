import type { JsonSchema } from '../api/get-openapi';

/** A schema in a few words for the reference table: "integer ≥ 1, default 25", "one of asc, desc", "string (binary)". */
export function schemaWords(schema: JsonSchema | undefined): string {
  if (!schema) return 'any';
  if (schema.$ref) return schema.$ref.split('/').pop() ?? schema.$ref;
  const variants = schema.anyOf ?? schema.oneOf;
  if (variants) return variants.map(schemaWords).join(' or ');
  const parts: string[] = [];
  if (schema.enum) parts.push(`one of ${schema.enum.map((v) => JSON.stringify(v)).join(', ')}`);
  else if (schema.type === 'array') parts.push(`list of ${schemaWords(schema.items)}`);
  else parts.push(Array.isArray(schema.type) ? schema.type.join(' or ') : (schema.type ?? 'any'));
  if (schema.format) parts[0] += ` (${schema.format})`;
  if (schema.minimum !== undefined) parts.push(`≥ ${schema.minimum}`);
  if (schema.exclusiveMinimum !== undefined) parts.push(`> ${schema.exclusiveMinimum}`);
  if (schema.maximum !== undefined) parts.push(`≤ ${schema.maximum}`);
  if (schema.minLength !== undefined && schema.minLength > 0) parts.push(`at least ${schema.minLength} characters`);
  if (schema.maxLength !== undefined) parts.push(`at most ${schema.maxLength} characters`);
  if (schema.default !== undefined) parts.push(`default ${JSON.stringify(schema.default)}`);
  return parts.join(', ');
}
