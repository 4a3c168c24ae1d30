// @vitest-environment jsdom
import { cleanup, screen } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { jsonFetch, renderApp } from './render-app';

beforeEach(() => {
  vi.stubGlobal('fetch', vi.fn(jsonFetch(200, { status: 'ok', database: 'up', storage: 'up', mail: 'up' })));
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('routes', () => {
  it('renders the 404 page, inside the layout, for an unknown path', () => {
    renderApp('/no/such/page');
    expect(screen.getByRole('heading', { level: 1, name: 'Page not found' })).toBeTruthy();
    expect(screen.getByText('/no/such/page').tagName).toBe('CODE');
    expect(screen.getByRole('link', { name: 'Back to home' }).getAttribute('href')).toBe('/');
    expect(screen.getByRole('banner')).toBeTruthy();
  });

  it('renders the sign-in form with labelled fields, enabled', () => {
    renderApp('/sign-in');
    expect(screen.getByRole('heading', { level: 1, name: 'Sign in' })).toBeTruthy();
    const email = screen.getByLabelText('Email') as HTMLInputElement;
    const password = screen.getByLabelText('Password') as HTMLInputElement;
    expect(email.type).toBe('email');
    expect(password.type).toBe('password');
    expect(email.matches(':disabled')).toBe(false);
    expect(screen.getByRole('link', { name: 'Forgot your password?' }).getAttribute('href')).toBe('/forgot-password');
  });
});

describe('top bar', () => {
  it('shows the mark with an accessible name, the product name, the nav and the account slot', () => {
    renderApp('/');
    const banner = screen.getByRole('banner');
    const mark = screen.getByRole('img', { name: 'Tangentry mark' });
    expect(banner.contains(mark)).toBe(true);
    expect(mark.tagName.toLowerCase()).toBe('svg');
    expect(screen.getByRole('link', { name: 'Tangentry, home' }).textContent).toContain('Tangentry');

    const nav = screen.getByRole('navigation', { name: 'Main' });
    const home = screen.getByRole('link', { name: 'Home' });
    expect(nav.contains(home)).toBe(true);
    expect(home.getAttribute('aria-current')).toBe('page');

    expect(screen.getByRole('link', { name: 'Sign in' }).getAttribute('href')).toBe('/sign-in');
    expect(screen.getByRole('main')).toBeTruthy();
  });
});
