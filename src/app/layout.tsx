import { NavLink, Outlet, useNavigate } from 'react-router';
import { useState } from 'react';
import { ROLE_LABELS } from '@shared/roles.ts';
import { NAV } from '@/config/nav.ts';
import { paths } from '@/config/paths.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { useSignOut } from '@/features/auth/api/sign-in.ts';
import { Logo } from '@/components/brand/logo.tsx';

export function AppLayout() {
  const { data: me } = useMe();
  const navigate = useNavigate();
  const signOut = useSignOut();
  const [menuOpen, setMenuOpen] = useState(false);
  if (!me) return null;
  const items = NAV.filter((i) => !i.needs || hasAbility(me, i.needs));

  const leave = (everywhere: boolean) =>
    signOut.mutate({ everywhere }, { onSettled: () => navigate(paths.signIn.href(), { replace: true }) });

  return (
    <div className="flex min-h-screen flex-col md:flex-row">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-card focus:p-2">
        Skip to content
      </a>
      <nav aria-label="Main" className="flex w-full shrink-0 flex-col bg-ink text-paper md:w-56">
        <div className="flex items-center gap-2 px-4 py-4">
          <Logo />
          <span className="text-lg font-semibold tracking-tight">Stackyard</span>
        </div>
        <p className="px-4 pb-3 text-xs uppercase tracking-wider text-paper/60" data-testid="nav-role">
          {ROLE_LABELS[me.role]}
        </p>
        <ul className="flex flex-1 flex-wrap gap-0.5 px-2 pb-2 md:block md:space-y-0.5 md:pb-0">
          {items.map((item) => (
            <li key={item.href}>
              <NavLink
                to={item.href}
                end={item.href === '/'}
                className={({ isActive }) =>
                  `block rounded-md px-3 py-1.5 text-sm ${isActive ? 'bg-paper/15 font-semibold text-white' : 'text-paper/80 hover:bg-paper/10 hover:text-white'}`
                }
              >
                {item.label}
              </NavLink>
            </li>
          ))}
        </ul>
        <div className="relative border-t border-paper/15 p-2">
          <button
            type="button"
            aria-haspopup="menu"
            aria-expanded={menuOpen}
            onClick={() => setMenuOpen((o) => !o)}
            className="w-full rounded-md px-3 py-2 text-left hover:bg-paper/10"
          >
            <span className="block text-sm font-medium">{me.user.name}</span>
            <span className="block truncate text-xs text-paper/60">{me.company?.name ?? me.user.email}</span>
          </button>
          {menuOpen && (
            <div role="menu" className="absolute bottom-full left-2 right-2 mb-1 rounded-md border border-line bg-card py-1 text-ink shadow-lg">
              <p className="px-3 py-1 text-xs text-ink-soft">{me.user.email}</p>
              <button role="menuitem" type="button" className="block w-full px-3 py-1.5 text-left text-sm hover:bg-paper" onClick={() => leave(false)}>
                Sign out
              </button>
              <button role="menuitem" type="button" className="block w-full px-3 py-1.5 text-left text-sm hover:bg-paper" onClick={() => leave(true)}>
                Sign out on every device
              </button>
            </div>
          )}
        </div>
      </nav>
      <main id="main" className="min-w-0 flex-1">
        <Outlet />
      </main>
    </div>
  );
}
