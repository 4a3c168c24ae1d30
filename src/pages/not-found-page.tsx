import { Link, useLocation } from 'react-router-dom';

export function NotFoundPage() {
  const { pathname } = useLocation();
  return (
    <section aria-labelledby="not-found-heading" className="mx-auto max-w-xl py-16">
      <title>Page not found · Tangentry</title>
      <p className="font-mono text-sm text-ink/60 dark:text-paper/60">404</p>
      <h1 id="not-found-heading" className="mt-1 text-2xl font-semibold tracking-tight">
        Page not found
      </h1>
      <p className="mt-3">
        There is no page at <code className="rounded bg-grid-minor/50 px-1 py-0.5 text-[0.95em] break-all dark:bg-night-line">{pathname}</code>.
      </p>
      <Link
        to="/"
        className="mt-6 inline-block rounded border border-ink/30 px-4 py-2 font-medium hover:border-ink dark:border-paper/30 dark:hover:border-paper"
      >
        Back to home
      </Link>
    </section>
  );
}
