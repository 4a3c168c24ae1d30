import { Link } from 'react-router-dom';

/**
 * The right-hand end of the top bar. The accounts work puts the team switcher and the user menu
 * here; until then it offers the sign-in page.
 */
export function TopBarAccountSlot() {
  return (
    <div className="flex items-center gap-3" data-slot="account">
      <Link
        to="/sign-in"
        className="rounded border border-ink/30 px-3 py-1.5 text-sm font-medium hover:border-ink hover:bg-card motion-safe:transition-colors dark:border-paper/30 dark:hover:border-paper dark:hover:bg-night-card"
      >
        Sign in
      </Link>
    </div>
  );
}
