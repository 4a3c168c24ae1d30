// @vitest-environment jsdom
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createMemoryRouter, RouterProvider, type NonIndexRouteObject, type RouteObject } from 'react-router-dom';
import { AppProviders } from '../../../src/app/providers';
import { routes } from '../../../src/app/router';

afterEach(() => {
  cleanup();
  vi.restoreAllMocks();
});

function Broken(): never {
  throw new Error('curve document has no keys');
}

/** The app's own route tree with one extra page that throws while rendering. */
function withBrokenPage(): RouteObject[] {
  const layout = routes[0] as NonIndexRouteObject;
  const pages = layout.children?.[0] as NonIndexRouteObject;
  return [
    {
      ...layout,
      children: [{ ...pages, children: [{ path: 'broken', element: <Broken /> }, ...(pages.children ?? [])] }],
    },
  ];
}

describe('route error boundary', () => {
  it('shows a plain message, the error in one line, and ways out, inside the layout', () => {
    vi.spyOn(console, 'error').mockImplementation(() => {}); // React logs the caught error
    vi.spyOn(console, 'warn').mockImplementation(() => {});
    const router = createMemoryRouter(withBrokenPage(), { initialEntries: ['/broken'] });
    render(
      <AppProviders>
        <RouterProvider router={router} />
      </AppProviders>,
    );
    expect(screen.getByRole('heading', { level: 1, name: 'Something went wrong on this page' })).toBeTruthy();
    expect(screen.getByText('curve document has no keys')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Back to home' }).getAttribute('href')).toBe('/');
    // the page failed, not the layout: the top bar is still there
    expect(screen.getByRole('banner')).toBeTruthy();
  });
});
