// @vitest-environment jsdom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp } from './render-app';
import type { InboxDto } from '../../../shared/schemas/inbox';

// The page's rendering only: fetch answers /api/auth/me and /api/me/inbox (the API suite tests the real server).
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const TEAM = { id: '00000000-0000-4000-8000-000000000001', name: 'UI Motion' };
const item = (version: number, state: string, extra: Partial<InboxDto['reviewsToDo'][number]> = {}) => ({
  team: TEAM, pack: { slug: 'menu-transitions', name: 'Menu transitions' }, version, state, channel: null, by: null,
  at: '2026-11-30T10:00:00.000Z', path: `/packs/menu-transitions/versions/${version}`, ...extra,
});
const INBOX: InboxDto = {
  reviewsToDo: [item(3, 'proposed', { by: 'Pim Animator' })],
  myProposals: [item(2, 'changes-requested', { by: 'Lee Lead' })],
  recentReleases: [item(1, 'approved', { channel: 'shipping', by: 'Lee Lead' })],
  more: { reviewsToDo: false, myProposals: false, recentReleases: true },
};
const ME = {
  user: { id: 'u1', email: 'lee@corvid-lantern.test', name: 'Lee Lead', studioName: 'Corvid Lantern' },
  teams: [{ id: TEAM.id, name: TEAM.name, slug: 'ui-motion', studioName: 'Corvid Lantern', role: 'lead' }],
};

function answer(input: RequestInfo | URL): Response {
  const url = String(input);
  const body = url === '/api/auth/me' ? ME : url === '/api/me/inbox' ? INBOX : { status: 'ok', database: 'up', storage: 'up', mail: 'up' };
  return new Response(JSON.stringify(body), { status: 200, headers: { 'Content-Type': 'application/json' } });
}

describe('home page when signed in', () => {
  it('lists reviews to do, own proposals with their state in words, and releases, each linking to the version page', async () => {
    const fetchMock = vi.fn(async (input: RequestInfo | URL) => answer(input));
    vi.stubGlobal('fetch', fetchMock);
    renderApp('/');

    const reviews = await screen.findByRole('region', { name: 'Reviews to do' });
    expect(within(reviews).getByRole('link', { name: 'Menu transitions v3' }).getAttribute('href')).toBe('/packs/menu-transitions/versions/3');
    expect(within(reviews).getByText(/proposed by Pim Animator/)).toBeTruthy();
    const mine = screen.getByRole('region', { name: 'Your proposals' });
    expect(within(mine).getByText(/changes requested/)).toBeTruthy();
    const releases = screen.getByRole('region', { name: 'Recent releases' });
    expect(within(releases).getByText(/released to shipping by Lee Lead/)).toBeTruthy();
    expect(within(releases).getByRole('link', { name: 'Menu transitions v1' }).getAttribute('href')).toBe('/packs/menu-transitions/versions/1');
    // a list cut at the newest ones says so; a complete one does not
    expect(within(releases).getByText(/Showing the 1 newest; older ones/)).toBeTruthy();
    expect(within(mine).queryByText(/Showing the/)).toBeNull();
    // the signed-out home page's status card is not shown
    expect(screen.queryByRole('region', { name: 'Service status' })).toBeNull();
    await waitFor(() => expect(fetchMock.mock.calls.some(([u]) => String(u) === '/api/me/inbox')).toBe(true));
  });
});
