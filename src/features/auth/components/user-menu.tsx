import { Link, useNavigate } from 'react-router-dom';
import { useSignOut } from '../api/sign-out';

/** The signed-in person's name (→ profile) and a sign-out button. */
export function UserMenu({ name }: { name: string }) {
  const signOut = useSignOut();
  const navigate = useNavigate();
  return (
    <div className="flex items-center gap-2">
      <Link to="/profile" className="max-w-[12rem] truncate rounded px-2 py-1 text-sm font-medium hover:bg-card dark:hover:bg-night-card" title="Profile">
        {name}
      </Link>
      <button
        type="button"
        disabled={signOut.isPending}
        onClick={() => signOut.mutate(false, { onSuccess: () => navigate('/sign-in') })}
        className="rounded border border-ink/30 px-3 py-1.5 text-sm font-medium hover:border-ink hover:bg-card dark:border-paper/30 dark:hover:border-paper dark:hover:bg-night-card"
      >
        Sign out
      </button>
    </div>
  );
}
