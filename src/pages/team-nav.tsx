import { NavLink } from 'react-router-dom';
import { roleCan, type Role } from '../../shared/schemas/roles';

/** Sub-pages of the current team; what the role cannot use is not shown (the server still guards it). */
export function TeamNav({ role }: { role: Role }) {
  const items = [
    { to: '/team', label: 'Members', show: true },
    { to: '/team/profiles', label: 'Target profiles', show: true },
    { to: '/team/activity', label: 'Activity', show: true },
    { to: '/team/tokens', label: 'Service tokens', show: roleCan(role, 'tokens.manage') },
    { to: '/team/webhooks', label: 'Webhooks', show: roleCan(role, 'webhooks.manage') },
    { to: '/outbox', label: 'Outbox', show: roleCan(role, 'outbox.read') },
    { to: '/api-reference', label: 'Build-server API', show: true },
  ].filter((i) => i.show);
  return (
    <nav aria-label="Team" className="mt-4 flex gap-1 border-b border-grid-major dark:border-night-line">
      {items.map((i) => (
        <NavLink key={i.to} to={i.to} end className={({ isActive }) => `-mb-px border-b-2 px-3 py-2 text-sm font-medium ${isActive ? 'border-vermilion' : 'border-transparent text-ink/70 hover:text-ink dark:text-paper/70'}`}>
          {i.label}
        </NavLink>
      ))}
    </nav>
  );
}
