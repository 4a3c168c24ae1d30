import type { ReactNode } from 'react';

/** The one row a plain data table shows when it has nothing to list (tokens, webhooks, deliveries). */
export function EmptyRow({ span, children }: { span: number; children: ReactNode }) {
  return (
    <tr>
      <td colSpan={span} className="py-3 text-ink/65 dark:text-paper/65">
        {children}
      </td>
    </tr>
  );
}
