import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';

function describe(error: unknown): string {
  if (isRouteErrorResponse(error)) return `${error.status} ${error.statusText}`.trim();
  if (error instanceof Error) return error.message;
  return 'Unknown error';
}

/**
 * The router's errorElement: a plain message, what went wrong in one mono line, and two ways out.
 * Rendered inside the app layout for page errors, and on its own if the layout itself fails.
 */
export function RouteErrorBoundary() {
  const error = useRouteError();
  return (
    <section aria-labelledby="route-error-heading" className="mx-auto max-w-xl py-16">
      <title>Something went wrong · Tangentry</title>
      <h1 id="route-error-heading" className="text-2xl font-semibold">
        Something went wrong on this page
      </h1>
      <p className="mt-3">The page stopped while drawing. Nothing you saved is affected.</p>
      <p className="mt-3 rounded border border-grid-major bg-card px-3 py-2 font-mono text-sm break-words dark:border-night-line dark:bg-night-card">
        {describe(error)}
      </p>
      <div className="mt-6 flex gap-3">
        <button
          type="button"
          onClick={() => window.location.reload()}
          className="rounded bg-ink px-4 py-2 font-medium text-paper hover:bg-ink/85 dark:bg-paper dark:text-ink"
        >
          Try again
        </button>
        <Link
          to="/"
          className="rounded border border-ink/30 px-4 py-2 font-medium hover:border-ink dark:border-paper/30 dark:hover:border-paper"
        >
          Back to home
        </Link>
      </div>
    </section>
  );
}

/** Used when the layout itself failed: same message, with the page frame around it. */
export function RootErrorBoundary() {
  return (
    <main className="px-6">
      <RouteErrorBoundary />
    </main>
  );
}
