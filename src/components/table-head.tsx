/**
 * The head row of the app's plain data tables (tokens, webhooks, deliveries, problem codes): small
 * upper-case labels over a rule. A column given as `{ hidden }` is named for screen readers only
 * (an actions column).
 */
export type TableColumn = string | { label: string; hidden: true };

export function TableHead({ columns }: { columns: readonly TableColumn[] }) {
  return (
    <thead className="border-b border-grid-major text-xs uppercase tracking-wide text-ink/60 dark:border-night-line dark:text-paper/60">
      <tr>
        {columns.map((c, i) => {
          const label = typeof c === 'string' ? c : c.label;
          return (
            <th key={label} scope="col" className={`py-2 font-medium${i < columns.length - 1 ? ' pr-3' : ''}`}>
              {typeof c === 'string' ? c : <span className="sr-only">{c.label}</span>}
            </th>
          );
        })}
      </tr>
    </thead>
  );
}
