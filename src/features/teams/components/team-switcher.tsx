import { ROLE_LABEL, type Role } from '../../../../shared/schemas/roles';

/** The team switcher of the top bar: each of the person's teams with their role there. */
export function TeamSwitcher({ teams, currentId, onChange }: { teams: readonly { id: string; name: string; role: Role }[]; currentId: string | null; onChange: (id: string) => void }) {
  if (teams.length === 0) return null;
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="sr-only sm:not-sr-only text-ink/65 dark:text-paper/65">Team</span>
      <select
        aria-label="Current team"
        value={currentId ?? ''}
        onChange={(e) => onChange(e.target.value)}
        className="rounded border border-grid-major bg-card px-2 py-1 font-medium dark:border-night-line dark:bg-night-card"
      >
        {teams.map((t) => (
          <option key={t.id} value={t.id}>
            {t.name} · {ROLE_LABEL[t.role]}
          </option>
        ))}
      </select>
    </label>
  );
}
