import { NavLink, Outlet } from 'react-router';
import { paths } from '../../lib/paths';

const navItems = [{ to: paths.sites.href(), label: 'Sites & circuits' }];

/** The shell: a header with the product name and navigation, and the page below it. */
export function AppLayout() {
  return (
    <div className="flex min-h-full flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:p-2">
        Skip to content
      </a>
      <header className="bg-ink-900 text-ink-50">
        <div className="mx-auto flex max-w-7xl items-center gap-8 px-6 py-3">
          <div className="flex items-center gap-2 text-lg font-semibold tracking-wide">
            <img src="/favicon.svg" alt="" className="h-7 w-7" />
            Headroom
          </div>
          <nav aria-label="Main" className="flex gap-1">
            {navItems.map((item) => (
              <NavLink
                key={item.to}
                to={item.to}
                className={({ isActive }) =>
                  `rounded px-3 py-1.5 text-sm font-medium ${isActive ? 'bg-ink-700 text-white' : 'text-ink-100 hover:bg-ink-800'}`
                }
              >
                {item.label}
              </NavLink>
            ))}
          </nav>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-6 py-6">
        <Outlet />
      </main>
      <footer className="border-t border-ink-100 px-6 py-3 text-center text-xs text-ink-500">
        Measurements on energised circuits are for qualified persons. Headroom gives engineering estimates; local
        codes and the authority having jurisdiction decide.
      </footer>
    </div>
  );
}
