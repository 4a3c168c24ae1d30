import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { useCurrentTeam } from '../app/use-current-team';
import type { MyTeam, Me } from '../features/auth/api/get-me';

/** Renders children with the person and their current team, or asks them to sign in. */
export function RequireSignIn({ children }: { children: (ctx: { me: Me; team: MyTeam | null }) => ReactNode }) {
  const { me, team } = useCurrentTeam();
  if (me.isPending) return <p className="text-sm">Loading…</p>;
  if (!me.data)
    return (
      <section className="mx-auto max-w-md py-10">
        <h1 className="text-2xl font-semibold">Sign in to continue</h1>
        <p className="mt-3">
          This page needs an account. <Link to="/sign-in" className="underline">Sign in</Link>.
        </p>
      </section>
    );
  return <>{children({ me: me.data, team })}</>;
}
