import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The parts of an OpenAPI 3.1 document the reference page reads (the server makes it: server/openapi.ts). */
export interface JsonSchema {
  type?: string | string[];
  $ref?: string;
  enum?: unknown[];
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  items?: JsonSchema;
  properties?: Record<string, JsonSchema>;
  required?: string[];
  format?: string;
  default?: unknown;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  minLength?: number;
  maxLength?: number;
  description?: string;
}

export interface ApiParameter {
  name: string;
  in: 'path' | 'query';
  required?: boolean;
  schema: JsonSchema;
}

export interface ApiOperation {
  operationId: string;
  tags: string[];
  description?: string;
  parameters?: ApiParameter[];
  requestBody?: { content: Record<string, { schema: JsonSchema }> };
  responses: Record<string, { description: string }>;
}

export interface ApiDocument {
  openapi: string;
  info: { title: string; version: string; description?: string };
  paths: Record<string, Record<string, ApiOperation>>;
  components: { schemas: Record<string, JsonSchema> };
}

export const openApiQueryOptions = () =>
  queryOptions({
    queryKey: ['openapi'],
    queryFn: ({ signal }) => api.get<ApiDocument>('/openapi.json', { signal }),
    staleTime: Infinity,
  });

export function useOpenApi() {
  return useQuery(openApiQueryOptions());
}
