// @vitest-environment jsdom
/**
 * The pack page's bake progress (src/features/packs/bake-progress.tsx), rendering only: fetch answers
 * GET …/bakes with a bake that advances 3 → 5 of 5 targets and one that failed; the Retry button posts
 * …/bakes/:id/retry. The API suite (background-bakes.test.ts) tests the real server behind these routes.
 */
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { BakeProgress, bakeProgressText } from '../../src/features/packs/bake-progress';
import type { BakeDto } from '../../shared/schemas/versions';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const TEAM = '00000000-0000-4000-8000-000000000001';
const bake = (id: string, extra: Partial<BakeDto>): BakeDto => ({
  id, packId: 'p1', state: 'baking', changelog: `change ${id}`, proposedBy: { id: 'u1', name: 'Pim Animator' }, curveCount: 4,
  progress: { done: 0, total: 5 }, failure: null, attempts: 1, version: null, source: { key: 'sha256/ab', sha256: 'ab', size: 10 },
  createdAt: '2026-12-01T10:00:00.000Z', updatedAt: '2026-12-01T10:00:00.000Z', ...extra,
});

describe('bake progress on the pack page', () => {
  it('words go with the bar', () => {
    expect(bakeProgressText({ state: 'baking', progress: { done: 3, total: 5 } })).toBe('Baking 3 of 5 targets');
    expect(bakeProgressText({ state: 'queued', progress: { done: 0, total: 1 } })).toBe('Queued: 0 of 1 target baked');
  });

  it('polls while a bake is unfinished, shows the progress bar, then drops the finished bake; a failed one shows target, curve, reason and Retry', async () => {
    let calls = 0;
    const posted: string[] = [];
    const failed = bake('f', { state: 'failed', progress: { done: 2, total: 5 }, failure: { target: 'Handheld', curve: 'ease-out-dock', reason: 'could not store the Handheld binary output: connect ECONNREFUSED' } });
    vi.stubGlobal('fetch', vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = String(input);
      if (init?.method === 'POST') {
        posted.push(url);
        return new Response(JSON.stringify({ bake: { ...failed, state: 'queued', failure: null } }), { status: 202, headers: { 'Content-Type': 'application/json' } });
      }
      calls++;
      const list = calls === 1 ? [bake('a', { progress: { done: 3, total: 5 } }), failed] : [failed];
      return new Response(JSON.stringify({ bakes: list }), { status: 200, headers: { 'Content-Type': 'application/json' } });
    }));
    const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    render(<QueryClientProvider client={qc}><BakeProgress teamId={TEAM} slug="menu-transitions" canRetry /></QueryClientProvider>);

    const bar = await screen.findByRole('progressbar', { name: 'Bake of “change a”' });
    expect(bar.getAttribute('aria-valuenow')).toBe('3');
    expect(bar.getAttribute('aria-valuemax')).toBe('5');
    expect(screen.getByText('Baking 3 of 5 targets')).toBeTruthy();
    const failedRow = screen.getByRole('progressbar', { name: 'Bake of “change f”' }).closest('li')!;
    expect(within(failedRow).getByText(/could not store the Handheld binary output/)).toBeTruthy();
    expect(within(failedRow).getByText('ease-out-dock')).toBeTruthy();
    expect(within(failedRow).getByText('Handheld')).toBeTruthy();

    // refetchInterval (1 s) while a bake is unfinished: the next answer no longer lists "a" (it became a version)
    await waitFor(() => expect(screen.queryByRole('progressbar', { name: 'Bake of “change a”' })).toBeNull(), { timeout: 3000 });
    expect(calls).toBeGreaterThanOrEqual(2);

    fireEvent.click(within(failedRow).getByRole('button', { name: 'Retry' }));
    await waitFor(() => expect(posted).toEqual([`/api/teams/${TEAM}/packs/menu-transitions/bakes/f/retry`]));
  });
});
