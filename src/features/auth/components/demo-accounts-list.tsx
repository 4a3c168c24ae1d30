import { ROLE_LABEL } from '../../../../shared/schemas/roles';
import { useDemoAccounts } from '../api/get-demo-accounts';

/** Shown only when the server says it runs the embedded default (GET /api/auth/demo-accounts). */
export function DemoAccountsList({ onPick }: { onPick: (email: string) => void }) {
  const demo = useDemoAccounts();
  if (!demo.data?.enabled) return null;
  return (
    <section aria-labelledby="demo-heading" className="mt-6 rounded-md border border-dashed border-grid-major bg-card/70 p-4 dark:border-night-line dark:bg-night-card/70">
      <h2 id="demo-heading" className="text-sm font-semibold">
        Demo accounts (embedded default)
      </h2>
      <p className="mt-1 text-sm text-ink/75 dark:text-paper/75">
        Every one has the password <code className="rounded bg-grid-minor/60 px-1 font-mono dark:bg-night-line">{demo.data.password}</code>. Pick one to fill in the address.
      </p>
      <ul className="mt-3 divide-y divide-grid-minor dark:divide-night-line">
        {demo.data.accounts.map((a) => (
          <li key={a.email} className="flex items-center justify-between gap-3 py-2">
            <div className="min-w-0">
              <p className="font-mono text-sm">{a.email}</p>
              <p className="text-xs text-ink/65 dark:text-paper/65">
                {a.name} · {Object.entries(a.teams).map(([t, r]) => `${ROLE_LABEL[r].toLowerCase()} in ${t}`).join(', ')}
              </p>
            </div>
            <button type="button" onClick={() => onPick(a.email)} className="shrink-0 rounded border border-ink/30 px-2 py-1 text-xs font-medium hover:border-ink dark:border-paper/30" aria-label={`Use ${a.email}`}>
              Use
            </button>
          </li>
        ))}
      </ul>
    </section>
  );
}
