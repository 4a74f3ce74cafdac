import { useCallback, useEffect, useRef, useState } from 'react';
import { Link, NavLink, Outlet, useLocation, useNavigate, useNavigation } from 'react-router';
import { BrandMark } from '@/components/ui/brand-mark';
import { Button } from '@/components/ui/button';
import { useMe } from '@/features/auth/api/get-me';
import { useSignOut } from '@/features/auth/api/sign-out';
import { cx } from '@/lib/class-names';
import { roleLabels } from '@/lib/roles';
import { MenuGroup } from './menu-group';
import { isWithin, landingPaths, menuEntriesFor, menuFor, pages, type PageAccess } from './navigation';

/**
 * The frame around every signed-in page: brand, the role's menu, who is signed in and a way to
 * sign out. On narrow screens the menu sits at the bottom, within reach of a thumb.
 */
export function AppShell() {
  const { data: user } = useMe();
  const navigation = useNavigation();
  const navigate = useNavigate();
  const signOut = useSignOut();
  const { pathname } = useLocation();
  const [openGroup, setOpenGroup] = useState<string | null>(null);
  const groupOpenChange = useCallback(
    (key: string) => (open: boolean) => setOpenGroup((current) => (open ? key : current === key ? null : current)),
    [],
  );

  // A new page closes any open group (also when it was reached some other way than the menu).
  useEffect(() => setOpenGroup(null), [pathname]);
  useFocusHeadingOnNavigation(pathname);

  if (!user) return null;
  const menu = menuFor(user.role);
  const entries = menuEntriesFor(user.role);
  const topLinks = entries.filter((e) => !(e.kind === 'page' && e.page === pages.account));
  const account = menu.includes(pages.account) ? pages.account : null;
  // A grouped (longer) menu needs the width of a desk for the header; below that it sits at the bottom.
  const grouped = entries.some((e) => e.kind === 'group');

  function onSignOut() {
    signOut.mutate(undefined, {
      onSettled: () => navigate('/sign-in', { replace: true, state: { notice: 'You are signed out.' } }),
    });
  }

  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:fixed focus:top-2 focus:left-2 focus:z-50 focus:rounded-md focus:bg-surface focus:px-3 focus:py-2 focus:text-ink focus:shadow"
      >
        Skip to content
      </a>
      {navigation.state === 'loading' ? <div aria-hidden="true" className="fixed inset-x-0 top-0 z-40 h-0.5 animate-pulse bg-accent" /> : null}

      <header data-pinned="" className="sticky top-0 z-30 print:static border-b border-line bg-paper/95 backdrop-blur supports-[backdrop-filter]:bg-paper/85">
        <div className="mx-auto flex h-14 max-w-7xl items-center gap-6 px-4 sm:px-6">
          <Link to={landingPaths[user.role]} aria-label="Reboundry, your start page" className="shrink-0 rounded">
            <BrandMark />
          </Link>
          <nav aria-label="Main" className={cx('hidden h-full min-w-0 flex-1', grouped ? 'lg:flex' : 'md:flex')}>
            <ul className="flex h-full flex-1 items-stretch gap-1">
              {topLinks.map((entry) =>
                entry.kind === 'page' ? (
                  <li key={entry.page.path} className="flex">
                    <TopLink page={entry.page} />
                  </li>
                ) : (
                  <MenuGroup
                    key={entry.id}
                    label={entry.label}
                    pages={entry.pages}
                    active={entry.pages.some((p) => isWithin(pathname, p))}
                    open={openGroup === `top:${entry.id}`}
                    onOpenChange={groupOpenChange(`top:${entry.id}`)}
                  />
                ),
              )}
              {account ? (
                <li className="ml-auto flex">
                  <TopLink page={account} />
                </li>
              ) : null}
            </ul>
          </nav>
          <div className={cx('ml-auto flex shrink-0 items-center gap-3', grouped ? 'lg:ml-0' : 'md:ml-0')}>
            <p className="hidden text-right leading-tight sm:block">
              <span className="block text-sm font-medium text-ink">{user.name}</span>
              <span className="block text-xs text-slate">{roleLabels[user.role]}</span>
            </p>
            <Button size="sm" variant="secondary" onClick={onSignOut} busy={signOut.isPending}>
              Sign out
            </Button>
          </div>
        </div>
      </header>

      <main id="main" tabIndex={-1} className={cx('mx-auto w-full max-w-7xl flex-1 px-4 pt-6 pb-28 outline-none sm:px-6', grouped ? 'lg:pb-12' : 'md:pb-12')}>
        <Outlet />
      </main>

      <nav aria-label="Main" data-pinned="" className={cx(
          'fixed inset-x-0 bottom-0 z-30 print:static border-t border-line bg-surface pb-[env(safe-area-inset-bottom)]',
          grouped ? 'lg:hidden' : 'md:hidden',
        )}
      >
        <ul className="flex">
          {entries.map((entry) => {
            if (entry.kind === 'group')
              return (
                <MenuGroup
                  key={entry.id}
                  placement="bottom"
                  icon={entry.pages[0]?.icon}
                  label={entry.label}
                  pages={entry.pages}
                  active={entry.pages.some((p) => isWithin(pathname, p))}
                  open={openGroup === `bottom:${entry.id}`}
                  onOpenChange={groupOpenChange(`bottom:${entry.id}`)}
                />
              );
            const item = entry.page;
            return (
            <li key={item.path} className="min-w-0 flex-1">
              <NavLink
                to={item.path}
                className={({ isActive }) =>
                  cx(
                    'flex min-h-14 flex-col items-center justify-center gap-0.5 px-1 text-xs font-medium',
                    'border-t-2',
                    isActive ? 'border-accent text-ink' : 'border-transparent text-slate',
                  )
                }
              >
                {item.icon}
                <span className="max-w-full truncate">{item.label}</span>
              </NavLink>
            </li>
            );
          })}
        </ul>
      </nav>
    </div>
  );
}

function TopLink({ page }: { page: PageAccess }) {
  return (
    <NavLink
      to={page.path}
      className={({ isActive }) =>
        cx(
          'relative flex items-center px-3 text-[0.9375rem] font-medium whitespace-nowrap transition-colors',
          'after:absolute after:inset-x-3 after:bottom-0 after:h-0.5 after:rounded-full',
          isActive ? 'text-ink after:bg-accent' : 'text-slate hover:text-ink after:bg-transparent',
        )
      }
    >
      {page.label}
    </NavLink>
  );
}

/**
 * After moving to another page inside the app, keyboard and screen-reader focus goes to the new
 * page's first heading, as it would on a full page load (where it starts at the top). The page
 * may still be loading, so this waits a moment for its heading to appear. Not on the first load.
 */
function useFocusHeadingOnNavigation(pathname: string) {
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    const main = document.getElementById('main');
    if (!main) return;
    const focus = () => {
      const h1 = main.querySelector('h1');
      if (!h1) return false;
      if (!h1.hasAttribute('tabindex')) h1.setAttribute('tabindex', '-1');
      h1.focus({ preventScroll: false });
      return true;
    };
    if (focus()) return;
    const observer = new MutationObserver(() => {
      if (focus()) observer.disconnect();
    });
    observer.observe(main, { childList: true, subtree: true });
    const stop = setTimeout(() => observer.disconnect(), 5000);
    return () => {
      observer.disconnect();
      clearTimeout(stop);
    };
  }, [pathname]);
}

