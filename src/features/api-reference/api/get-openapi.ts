import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { openApiKeys } from './keys';

/** The parts of an OpenAPI 3.1 schema object the reference page shows. */
export interface SchemaObject {
  type?: string | string[];
  format?: string;
  enum?: unknown[];
  const?: unknown;
  minLength?: number;
  maxLength?: number;
  minimum?: number;
  maximum?: number;
  minItems?: number;
  maxItems?: number;
  pattern?: string;
  default?: unknown;
  items?: SchemaObject;
  properties?: Record<string, SchemaObject>;
  required?: string[];
  anyOf?: SchemaObject[];
  oneOf?: SchemaObject[];
  allOf?: SchemaObject[];
  $ref?: string;
  description?: string;
}

export interface OperationObject {
  operationId: string;
  summary: string;
  description?: string;
  'x-access': 'public' | 'signed-in' | string[];
  parameters?: { name: string; in: 'path' | 'query'; required?: boolean; schema: SchemaObject }[];
  requestBody?: { content: Record<string, { schema: SchemaObject }> };
}

export interface OpenApiDocument {
  openapi: string;
  info: { title: string; version: string; description?: string };
  servers?: { url: string }[];
  paths: Record<string, Record<string, OperationObject>>;
}

export const openApiQueryOptions = () =>
  queryOptions({
    queryKey: openApiKeys.document(),
    queryFn: () => api.get<OpenApiDocument>('/api/openapi.json'),
    staleTime: Infinity,
  });

export const useOpenApi = (enabled: boolean) => useQuery({ ...openApiQueryOptions(), enabled });
