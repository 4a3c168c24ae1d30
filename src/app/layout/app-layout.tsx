import { Outlet } from 'react-router-dom';
import { TopBar } from './top-bar';

/** Every page: skip link, the top bar, the page in <main>. */
export function AppLayout() {
  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-10 focus:rounded focus:bg-card focus:px-3 focus:py-2 focus:text-ink"
      >
        Skip to content
      </a>
      <TopBar />
      <main id="main" tabIndex={-1} className="mx-auto w-full max-w-6xl flex-1 px-4 py-10 outline-none sm:px-6">
        <Outlet />
      </main>
    </div>
  );
}
