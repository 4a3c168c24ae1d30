import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest, isApiError } from '../../../lib/api-client';

/**
 * `GET /api/health`: 200 `{ status: "ok", database: "up", storage: "up", mail: "up" }` when every
 * service answers, 503 with the same shape and the failing part(s) `"down"` otherwise.
 */
const partState = z.enum(['up', 'down']);

export const healthReportSchema = z.object({
  status: z.string(),
  database: partState,
  storage: partState,
  mail: partState,
});

export type HealthReport = z.infer<typeof healthReportSchema>;
export type HealthPart = Exclude<keyof HealthReport, 'status'>;
export const HEALTH_PARTS: readonly HealthPart[] = ['database', 'storage', 'mail'];

export interface HealthCheck {
  report: HealthReport;
  /** 200 or 503. */
  httpStatus: number;
  /** Client-measured round trip, milliseconds. */
  roundTripMs: number;
  /** When the answer arrived (ms since epoch). */
  checkedAt: number;
}

export async function getHealth({ signal }: { signal?: AbortSignal } = {}): Promise<HealthCheck> {
  const started = performance.now();
  let body: unknown;
  let httpStatus = 200;
  try {
    body = await apiRequest('/api/health', { signal });
  } catch (error) {
    // A 503 is still a health report: it names the part that is down.
    if (isApiError(error) && error.status === 503 && healthReportSchema.safeParse(error.body).success) {
      body = error.body;
      httpStatus = 503;
    } else {
      throw error;
    }
  }
  const roundTripMs = performance.now() - started;
  const parsed = healthReportSchema.safeParse(body);
  if (!parsed.success) {
    throw new Error('The server answered /api/health, but not with a health report.');
  }
  return { report: parsed.data, httpStatus, roundTripMs, checkedAt: Date.now() };
}

/** Polled every 30 s; no retries, the next poll is the retry. */
export const HEALTH_REFETCH_MS = 30_000;

export function healthQueryOptions() {
  return queryOptions({
    queryKey: ['health'] as const,
    queryFn: ({ signal }) => getHealth({ signal }),
    refetchInterval: HEALTH_REFETCH_MS,
    staleTime: 10_000,
    retry: false,
  });
}

export function useHealth() {
  return useQuery(healthQueryOptions());
}
