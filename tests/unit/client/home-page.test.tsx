// @vitest-environment jsdom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { jsonFetch, renderApp } from './render-app';

// The /api/health contract of issue 2, item 5: 200 with every part "up", 503 with the same shape
// and the failing part "down". Mocked at the fetch boundary; the real server is tested by the API suite.
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function part(name: 'database' | 'storage' | 'mail') {
  return screen.getByTestId(`service-${name}`);
}

describe('home page service status card', () => {
  it('asks GET /api/health with same-origin credentials and shows every part up', async () => {
    const fetchMock = vi.fn(jsonFetch(200, { status: 'ok', database: 'up', storage: 'up', mail: 'up' }));
    vi.stubGlobal('fetch', fetchMock);
    renderApp('/');

    expect(screen.getByRole('heading', { level: 1 })).toBeTruthy();
    const card = screen.getByRole('region', { name: 'Service status' });
    await waitFor(() => expect(within(card).getByTestId('service-status-summary').textContent).toBe('all up'));

    for (const name of ['database', 'storage', 'mail'] as const) {
      expect(part(name).textContent).toBe('up');
      expect(part(name).querySelector('[data-tone]')?.getAttribute('data-tone')).toBe('pass');
    }
    expect(within(card).getByText(/HTTP 200/).className).toContain('font-mono');

    // the top bar also asks GET /api/auth/me (who is signed in); the card asks health exactly once
    const healthCalls = fetchMock.mock.calls.filter(([u]) => String(u) === '/api/health');
    expect(healthCalls).toHaveLength(1);
    const [url, init] = healthCalls[0]!;
    expect(url).toBe('/api/health');
    expect(init?.credentials).toBe('same-origin');
    expect(init?.method).toBe('GET');
  });

  it('names the part that is down on a 503 and says so in words, not only colour', async () => {
    vi.stubGlobal('fetch', vi.fn(jsonFetch(503, { status: 'error', database: 'up', storage: 'up', mail: 'down' })));
    renderApp('/');

    const card = screen.getByRole('region', { name: 'Service status' });
    await waitFor(() => expect(within(card).getByTestId('service-status-summary').textContent).toBe('degraded'));
    expect(part('database').textContent).toBe('up');
    expect(part('storage').textContent).toBe('up');
    expect(part('mail').textContent).toBe('down');
    expect(part('mail').querySelector('[data-tone]')?.getAttribute('data-tone')).toBe('over');
    expect(within(card).getByText(/HTTP 503/)).toBeTruthy();
  });

  it('says "unreachable" when the request fails outright', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => {
        throw new TypeError('fetch failed');
      }),
    );
    renderApp('/');

    const card = screen.getByRole('region', { name: 'Service status' });
    await waitFor(() => expect(within(card).getByTestId('service-status-summary').textContent).toBe('unreachable'));
    expect(within(card).getByText(/Could not reach the server for \/api\/health/)).toBeTruthy();
    expect(within(card).queryByTestId('service-mail')).toBeNull();
  });

  it('says "unreachable" when something answers that is not a health report (e.g. an HTML fallback)', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => new Response('<!doctype html><p>hi</p>', { status: 200, headers: { 'Content-Type': 'text/html' } })),
    );
    renderApp('/');

    const card = screen.getByRole('region', { name: 'Service status' });
    await waitFor(() => expect(within(card).getByTestId('service-status-summary').textContent).toBe('unreachable'));
    expect(within(card).getByText(/was not JSON/)).toBeTruthy();
  });
});
