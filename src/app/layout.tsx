import { Navigate, NavLink, Outlet, useLocation, useNavigate } from 'react-router';
import { useEffect, useId, useRef, useState } from 'react';
import { ROLE_LABELS } from '@shared/roles.ts';
import { NAV } from '@/config/nav.ts';
import { paths } from '@/config/paths.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { useSignOut } from '@/features/auth/api/sign-in.ts';
import { Logo } from '@/components/brand/logo.tsx';
import { CATALOGUE_SEARCH_ID, isSearchShortcut, SEARCH_SHORTCUTS, SHORTCUT_LABELS, setSearchShortcut, useSearchShortcut, type SearchShortcut } from '@/lib/search-shortcut.ts';

/**
 * The frame every signed-in page sits in. It draws at once: while the session check is on its
 * way the navigation shows without its items; with no session it goes to sign-in. On a phone the
 * navigation is a bar with a menu button; from 768 px it is the dark column on the left.
 */
export function AppLayout() {
  const { data: me, isPending, error } = useMe();
  const location = useLocation();
  const navigate = useNavigate();
  const [menuOpen, setMenuOpen] = useState(false);
  const [navOpen, setNavOpen] = useState(false);
  const shortcut = useSearchShortcut();
  const navId = useId();
  const userButton = useRef<HTMLButtonElement>(null);

  // The user menu closes on Escape (focus back on its button) or on a click outside it.
  const userMenu = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!menuOpen) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== 'Escape') return;
      setMenuOpen(false);
      userButton.current?.focus();
    };
    const onPointer = (e: PointerEvent) => {
      if (!userMenu.current?.contains(e.target as Node) && !userButton.current?.contains(e.target as Node)) setMenuOpen(false);
    };
    document.addEventListener('keydown', onKey);
    document.addEventListener('pointerdown', onPointer);
    return () => {
      document.removeEventListener('keydown', onKey);
      document.removeEventListener('pointerdown', onPointer);
    };
  }, [menuOpen]);

  // Moving to another page closes the phone menu.
  useEffect(() => setNavOpen(false), [location.pathname]);

  // The search shortcut works from every page: here it focuses the box, elsewhere it opens the catalogue.
  const canSearch = hasAbility(me, 'catalogue.view');
  useEffect(() => {
    if (!canSearch) return;
    const onKey = (e: KeyboardEvent) => {
      if (!isSearchShortcut(e, shortcut)) return;
      e.preventDefault();
      const box = document.getElementById(CATALOGUE_SEARCH_ID) as HTMLInputElement | null;
      if (box) {
        box.focus();
        box.select();
      } else navigate(paths.catalogue.href(), { state: { focusSearch: true } });
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [canSearch, shortcut, navigate]);

  const signOut = useSignOut();
  if (!isPending && !error && !me) return <Navigate to={paths.signIn.href(location.pathname + location.search)} replace />;
  if (error) throw error;
  const items = me ? NAV.filter((i) => !i.needs || hasAbility(me, i.needs)) : [];
  const leave = (everywhere: boolean) => signOut.mutate({ everywhere }, { onSettled: () => navigate(paths.signIn.href(), { replace: true }) });

  return (
    <div className="flex min-h-screen flex-col md:flex-row">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:bg-card focus:p-2">
        Skip to content
      </a>
      <nav aria-label="Main" className="on-dark flex shrink-0 flex-col bg-ink text-paper md:sticky md:top-0 md:h-screen md:w-56">
        <div className="flex items-center gap-2 px-4 py-3 md:py-4">
          <Logo />
          <span className="text-lg font-semibold tracking-tight">Stackyard</span>
          <button
            type="button"
            className="ml-auto rounded-md border border-paper/30 px-3 py-1.5 text-sm font-medium md:hidden"
            aria-expanded={navOpen}
            aria-controls={navId}
            onClick={() => setNavOpen((o) => !o)}
          >
            {navOpen ? 'Close menu' : 'Menu'}
          </button>
        </div>
        <div id={navId} className={`${navOpen ? 'flex' : 'hidden'} flex-1 flex-col md:flex`}>
          <p className="px-4 pb-3 text-xs uppercase tracking-wider text-paper/70" data-testid="nav-role">
            {me ? ROLE_LABELS[me.role] : ''}
          </p>
          <ul className="flex-1 space-y-0.5 px-2 pb-2">
            {items.map((item) => (
              <li key={item.href}>
                <NavLink
                  to={item.href}
                  end={item.href === '/'}
                  className={({ isActive }) =>
                    `block rounded-md px-3 py-2 text-sm md:py-1.5 ${isActive ? 'bg-paper/15 font-semibold text-white' : 'text-paper/85 hover:bg-paper/10 hover:text-white'}`
                  }
                >
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
          {me && (
            <div className="relative border-t border-paper/15 p-2">
              <button
                ref={userButton}
                type="button"
                aria-expanded={menuOpen}
                onClick={() => setMenuOpen((o) => !o)}
                className="w-full rounded-md px-3 py-2 text-left hover:bg-paper/10"
              >
                <span className="block text-sm font-medium">{me.user.name}</span>
                <span className="block truncate text-xs text-paper/70">{me.company?.name ?? me.user.email}</span>
              </button>
              {menuOpen && (
                <div ref={userMenu} className="on-light absolute bottom-full left-2 right-2 z-20 mb-1 rounded-md border border-line bg-card py-1 text-ink shadow-lg">
                  <p className="break-all px-3 py-1 text-xs text-ink-soft">{me.user.email}</p>
                  {canSearch && (
                    <label className="block px-3 py-1.5 text-sm">
                      <span className="mb-1 block text-xs font-semibold text-ink-soft">Search shortcut</span>
                      <select
                        value={shortcut}
                        onChange={(e) => setSearchShortcut(e.target.value as SearchShortcut)}
                        className="w-full rounded-md border border-line bg-card px-2 py-1 text-sm"
                      >
                        {SEARCH_SHORTCUTS.map((s) => (
                          <option key={s} value={s}>
                            {SHORTCUT_LABELS[s]}
                          </option>
                        ))}
                      </select>
                    </label>
                  )}
                  <button type="button" className="block w-full px-3 py-1.5 text-left text-sm hover:bg-paper" onClick={() => leave(false)}>
                    Sign out
                  </button>
                  <button type="button" className="block w-full px-3 py-1.5 text-left text-sm hover:bg-paper" onClick={() => leave(true)}>
                    Sign out on every device
                  </button>
                </div>
              )}
            </div>
          )}
        </div>
      </nav>
      <main id="main" className="min-w-0 flex-1" aria-busy={isPending}>
        {me ? <Outlet /> : <p className="px-6 py-5 text-sm text-ink-soft">Checking your sign-in…</p>}
      </main>
    </div>
  );
}
