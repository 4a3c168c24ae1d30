/**
 * From the served OpenAPI document to what the reference page shows: one entry per operation, with its
 * path parameters and documented statuses, and a curl command filled in with the person's own team id,
 * real pack/channel names where the team has them, and the `$TANGENTRY_TOKEN` placeholder (never a secret).
 */
export interface OpenApiParameter {
  name: string;
  in: string;
  description?: string;
  required?: boolean;
  schema?: { example?: unknown; type?: string };
}
export interface OpenApiOperation {
  operationId?: string;
  summary?: string;
  tags?: string[];
  security?: Record<string, string[]>[];
  parameters?: OpenApiParameter[];
  responses?: Record<string, { description?: string; content?: Record<string, unknown> }>;
}
export interface OpenApiDocument {
  openapi: string;
  info: { title: string; version: string; description?: string };
  paths: Record<string, Record<string, OpenApiOperation>>;
}

export interface Endpoint {
  id: string;
  method: string;
  path: string;
  summary: string;
  tag: string;
  isPublic: boolean;
  parameters: OpenApiParameter[];
  responses: { status: string; description: string; problem: boolean }[];
  download: boolean;
}

export function endpointsOf(doc: OpenApiDocument): Endpoint[] {
  const out: Endpoint[] = [];
  for (const [path, ops] of Object.entries(doc.paths)) {
    for (const [method, op] of Object.entries(ops)) {
      const responses = Object.entries(op.responses ?? {}).map(([status, r]) => ({
        status, description: r.description ?? '', problem: Object.keys(r.content ?? {}).includes('application/problem+json'),
      }));
      out.push({
        id: op.operationId ?? `${method}-${path}`,
        method: method.toUpperCase(),
        path,
        summary: op.summary ?? '',
        tag: op.tags?.[0] ?? 'other',
        isPublic: Array.isArray(op.security) && op.security.length === 0,
        parameters: (op.parameters ?? []).filter((p) => p.in === 'path' || p.in === 'header'),
        responses,
        download: Object.keys(op.responses?.['200']?.content ?? {}).includes('application/octet-stream'),
      });
    }
  }
  return out;
}

export interface ExampleValues {
  origin: string;
  teamId: string;
  pack?: string;
  channel?: string;
  version?: number;
}

/** Fills {teamId} and the other path parameters: the person's values first, then the document's examples. */
export function examplePath(e: Endpoint, v: ExampleValues): string {
  const values: Record<string, string | undefined> = {
    teamId: v.teamId, pack: v.pack, channel: v.channel, number: v.version === undefined ? undefined : String(v.version),
  };
  return e.path.replace(/\{(\w+)\}/g, (_m, name: string) => {
    const own = values[name];
    if (own) return own;
    const ex = e.parameters.find((p) => p.name === name)?.schema?.example;
    return ex === undefined ? `{${name}}` : String(ex);
  });
}

/** A copy-paste curl command. Downloads follow a presigned redirect (-L) and save under the server's file name (-OJ). */
export function curlFor(e: Endpoint, v: ExampleValues): string {
  const url = `${v.origin}${examplePath(e, v)}`;
  const lines = ['curl --fail-with-body -sS'];
  if (!e.isPublic) lines.push('  -H "Authorization: Bearer $TANGENTRY_TOKEN"');
  if (e.download) lines.push('  -L -OJ');
  lines.push(`  "${url}"`);
  return lines.join(' \\\n');
}
