import { Link, NavLink } from 'react-router-dom';
import { TangentryMark } from '../../components/tangentry-mark';
import { TopBarAccountSlot } from './top-bar-account-slot';

/** Sections of the product; Library, Profiles and the rest join this list as they arrive. */
const NAV_ITEMS: readonly { to: string; label: string; end?: boolean }[] = [
  { to: '/', label: 'Home', end: true },
  { to: '/packs', label: 'Library' },
  { to: '/editor', label: 'Editor' },
];

export function TopBar() {
  return (
    <header className="border-b border-grid-major bg-paper/90 backdrop-blur-[2px] dark:border-night-line dark:bg-night/90">
      <div className="mx-auto flex h-14 max-w-6xl items-center gap-6 px-4 sm:px-6">
        <Link to="/" aria-label="Tangentry, home" className="flex items-center gap-2 rounded-sm">
          <TangentryMark className="h-8 w-8 shrink-0" />
          <span className="text-lg font-semibold tracking-tight">Tangentry</span>
        </Link>
        <nav aria-label="Main" className="flex-1">
          <ul className="flex items-center gap-1">
            {NAV_ITEMS.map((item) => (
              <li key={item.to}>
                <NavLink
                  to={item.to}
                  end={item.end}
                  className={({ isActive }) =>
                    `block rounded-sm border-b-2 px-2 py-1 text-sm font-medium motion-safe:transition-colors ${
                      isActive
                        ? 'border-vermilion text-ink dark:text-paper'
                        : 'border-transparent text-ink/70 hover:text-ink dark:text-paper/70 dark:hover:text-paper'
                    }`
                  }
                >
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <TopBarAccountSlot />
      </div>
    </header>
  );
}
