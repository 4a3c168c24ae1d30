import { Card } from '../components/card';

const inputClass =
  'mt-1 block w-full rounded border border-grid-major bg-paper px-3 py-2 text-ink disabled:cursor-not-allowed disabled:opacity-70 dark:border-night-line dark:bg-night dark:text-paper';

/**
 * Placeholder until accounts arrive: the form is shown so the page's place is clear, but it is
 * disabled and sends nothing.
 */
export function SignInPage() {
  return (
    <div className="mx-auto max-w-md">
      <title>Sign in · Tangentry</title>
      <h1 className="text-2xl font-semibold tracking-tight">Sign in</h1>
      <p id="sign-in-notice" className="mt-3 rounded border-l-4 border-amber bg-card px-3 py-2 text-sm dark:bg-night-card">
        Sign-in arrives with accounts. Until then this form is switched off and sends nothing.
      </p>
      <Card className="mt-6 p-5">
        <form aria-describedby="sign-in-notice" onSubmit={(event) => event.preventDefault()}>
          <fieldset disabled className="space-y-4">
            <legend className="sr-only">Account</legend>
            <div>
              <label htmlFor="sign-in-email" className="text-sm font-medium">
                Email
              </label>
              <input id="sign-in-email" name="email" type="email" autoComplete="email" className={inputClass} />
            </div>
            <div>
              <label htmlFor="sign-in-password" className="text-sm font-medium">
                Password
              </label>
              <input
                id="sign-in-password"
                name="password"
                type="password"
                autoComplete="current-password"
                className={inputClass}
              />
            </div>
            <button
              type="submit"
              className="w-full rounded bg-ink px-4 py-2 font-medium text-paper disabled:cursor-not-allowed disabled:opacity-60 dark:bg-paper dark:text-ink"
            >
              Sign in
            </button>
          </fieldset>
        </form>
      </Card>
    </div>
  );
}
