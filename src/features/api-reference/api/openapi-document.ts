import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { OpenApiDocument } from '../endpoints';

/** `GET /api/v1/openapi.json` → the build-server API's OpenAPI 3.1 document (public). */
export const getOpenApiDocument = (signal?: AbortSignal) => apiRequest<OpenApiDocument>('/api/v1/openapi.json', { signal });

export function openApiDocumentQueryOptions() {
  return queryOptions({ queryKey: ['api-v1', 'openapi'], queryFn: ({ signal }) => getOpenApiDocument(signal), staleTime: 5 * 60_000 });
}

export function useOpenApiDocument() {
  return useQuery(openApiDocumentQueryOptions());
}
