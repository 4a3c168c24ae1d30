// @vitest-environment jsdom
// The sign-in page: shared zod schema errors beside the fields before anything is sent, the server's
// refusal shown as a clear message, demo accounts listed only when the server says they are enabled.
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp } from './render-app';

type Route = (url: string, init?: RequestInit) => { status: number; body: unknown };

function stubApi(route: Route) {
  const calls: { url: string; init?: RequestInit }[] = [];
  vi.stubGlobal('fetch', vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = String(input);
    calls.push({ url, init });
    const { status, body } = route(url, init);
    return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
  }));
  return calls;
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const unauth = { status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in to continue.' } } };

describe('sign-in page', () => {
  it('shows the schema messages beside each field and sends nothing', async () => {
    const calls = stubApi((url) => (url.includes('demo-accounts') ? { status: 200, body: { enabled: false } } : unauth));
    renderApp('/sign-in');
    fireEvent.change(screen.getByLabelText('Email'), { target: { value: 'not an address' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('E-mail must look like name@example.test.')).toBeTruthy();
    expect(screen.getByText('Password is required.')).toBeTruthy();
    expect(screen.getByLabelText('Email').getAttribute('aria-invalid')).toBe('true');
    expect(calls.some((c) => c.url.includes('sign-in'))).toBe(false);
  });

  it('shows the server refusal for a wrong password', async () => {
    stubApi((url) =>
      url.includes('sign-in')
        ? { status: 401, body: { error: { code: 'wrong_credentials', message: 'That e-mail and password do not match an account.' } } }
        : url.includes('demo-accounts')
          ? { status: 200, body: { enabled: false } }
          : unauth,
    );
    renderApp('/sign-in');
    fireEvent.change(screen.getByLabelText('Email'), { target: { value: 'lead@corvid-lantern.test' } });
    fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'wrong' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect((await screen.findByRole('alert')).textContent).toMatch(/do not match/);
  });

  it('lists demo accounts only when the server enables them', async () => {
    stubApi((url) =>
      url.includes('demo-accounts')
        ? { status: 200, body: { enabled: true, password: 'tidewright-demo', accounts: [{ email: 'viewer@corvid-lantern.test', name: 'Bram Oduya', role: 'viewer', summary: 'reads', teams: { 'ui-motion': 'viewer' } }] } }
        : unauth,
    );
    renderApp('/sign-in');
    fireEvent.click(await screen.findByRole('button', { name: 'Use viewer@corvid-lantern.test' }));
    await waitFor(() => expect((screen.getByLabelText('Email') as HTMLInputElement).value).toBe('viewer@corvid-lantern.test'));
  });
});
