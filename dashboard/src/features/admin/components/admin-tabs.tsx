import type { ReactNode } from 'react';
import { NavLink } from 'react-router';
import { PageHeader } from '../../../components/ui/page-header';
import { paths } from '../../../lib/paths';

const tabs = [
  { to: paths.adminKeys.href(), label: 'API keys' },
  { to: paths.adminUsers.href(), label: 'Users' },
  { to: paths.adminAudit.href(), label: 'Audit log' },
];

/** The frame of the admin pages: heading and the tabs between keys, users and the audit log. */
export function AdminFrame({ subtitle, children }: { subtitle: string; children: ReactNode }) {
  return (
    <section aria-labelledby="admin-title" className="space-y-5">
      <PageHeader title="Administration" titleId="admin-title" subtitle={subtitle} />
      <nav aria-label="Admin" className="flex gap-1 border-b border-ink-100">
        {tabs.map((t) => (
          <NavLink
            key={t.to}
            to={t.to}
            className={({ isActive }) =>
              `-mb-px border-b-2 px-4 py-2 text-sm font-medium ${isActive ? 'border-amber-500 text-ink-950' : 'border-transparent text-ink-700 hover:text-ink-950'}`
            }
          >
            {t.label}
          </NavLink>
        ))}
      </nav>
      {children}
    </section>
  );
}
