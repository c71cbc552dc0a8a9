import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { NavLink, useLocation } from 'react-router';
import { Button } from '@/components/ui/button';
import { Logo } from '@/components/ui/logo';
import { cn } from '@/lib/cn';

export interface ShellNavItem {
  to: string;
  label: string;
  /** Match the path exactly (for the Home link at /app). */
  end?: boolean;
}

interface AppShellProps {
  navItems: readonly ShellNavItem[];
  organizationName: string;
  userName: string;
  roleLabel: string;
  onSignOut: () => void;
  onSignOutEverywhere: () => void;
  signingOut?: 'here' | 'everywhere' | null;
  signOutError?: string | null;
  children: ReactNode;
}

/**
 * The signed-in frame: a sidebar on wide screens, a top bar with a menu button on narrow ones.
 * There is one <nav aria-label="Main">; on a phone it is shown when the menu is open.
 */
export function AppShell({ navItems, organizationName, userName, roleLabel, onSignOut, onSignOutEverywhere, signingOut, signOutError, children }: AppShellProps) {
  const [menuOpen, setMenuOpen] = useState(false);
  const location = useLocation();
  const panelId = useId();

  const mainRef = useRef<HTMLElement>(null);
  const firstRender = useRef(true);

  useEffect(() => {
    setMenuOpen(false);
    // After moving to another page, start the keyboard and the screen reader at its content.
    if (firstRender.current) firstRender.current = false;
    else mainRef.current?.focus({ preventScroll: true });
  }, [location.pathname]);

  useEffect(() => {
    if (!menuOpen) return;
    const onKey = (event: KeyboardEvent) => event.key === 'Escape' && setMenuOpen(false);
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [menuOpen]);

  return (
    <div className="min-h-dvh lg:flex">
      <a href="#main" className="sr-only z-50 rounded-md bg-white px-4 py-2 font-semibold text-pine-800 focus:not-sr-only focus:fixed focus:top-2 focus:left-2">
        Skip to main content
      </a>

      {/* Narrow screens: top bar */}
      <header className="sticky top-0 z-30 flex items-center justify-between gap-3 bg-pine-900 px-4 py-2 text-white lg:hidden print:hidden">
        <div className="flex min-w-0 items-center gap-3">
          <Logo inverted className="text-base" />
          <span className="truncate text-sm text-pine-100">{organizationName}</span>
        </div>
        <button
          type="button"
          aria-expanded={menuOpen}
          aria-controls={panelId}
          onClick={() => setMenuOpen((open) => !open)}
          className="inline-flex min-h-10 items-center gap-2 rounded-md px-3 font-semibold hover:bg-pine-800"
        >
          <svg aria-hidden="true" viewBox="0 0 20 20" className="size-5" fill="none" stroke="currentColor" strokeWidth="2">
            {menuOpen ? <path d="M5 5l10 10M15 5 5 15" /> : <path d="M3 6h14M3 10h14M3 14h14" />}
          </svg>
          Menu
        </button>
      </header>

      {/* Sidebar (wide) / menu panel (narrow) */}
      <aside
        id={panelId}
        className={cn(
          // Printing a page (a statement) leaves the navigation off the paper.
          'z-20 flex-col bg-pine-900 text-pine-50 lg:sticky lg:top-0 lg:flex lg:h-dvh lg:w-64 lg:shrink-0 print:hidden',
          menuOpen ? 'fixed inset-x-0 top-14 bottom-0 flex overflow-y-auto' : 'hidden',
        )}
      >
        <div className="hidden px-5 pt-6 pb-4 lg:block">
          <Logo inverted />
          <p className="mt-3 text-sm font-semibold text-pine-100">{organizationName}</p>
        </div>

        <nav aria-label="Main" className="flex-1 px-3 py-4 lg:py-2">
          <ul className="space-y-1">
            {navItems.map((item) => (
              <li key={item.to}>
                <NavLink
                  to={item.to}
                  end={item.end}
                  className={({ isActive }) =>
                    cn(
                      'block rounded-md px-3 py-2 font-semibold',
                      isActive ? 'bg-pine-50 text-pine-900' : 'text-pine-50 hover:bg-pine-800',
                    )
                  }
                >
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>

        <section aria-label="Your account" className="border-t border-pine-700 px-5 py-4">
          <p className="font-semibold text-white">{userName}</p>
          <p className="text-sm text-pine-100">
            {roleLabel} · {organizationName}
          </p>
          {signOutError ? (
            <p role="alert" className="mt-2 rounded bg-rust-50 px-2 py-1 text-sm font-semibold text-rust-800">
              {signOutError}
            </p>
          ) : null}
          <div className="mt-3 flex flex-wrap gap-2">
            <Button
              size="sm"
              variant="secondary"
              onClick={onSignOut}
              isLoading={signingOut === 'here'}
              disabled={Boolean(signingOut)}
            >
              Sign out
            </Button>
            <Button
              size="sm"
              variant="ghost"
              className="text-pine-50 hover:bg-pine-800 hover:text-white"
              onClick={onSignOutEverywhere}
              isLoading={signingOut === 'everywhere'}
              disabled={Boolean(signingOut)}
            >
              Sign out everywhere
            </Button>
          </div>
        </section>
      </aside>

      <main ref={mainRef} id="main" tabIndex={-1} className="relative min-w-0 flex-1 px-4 py-6 sm:px-8 sm:py-8 focus:outline-none print:p-0">
        <div className="mx-auto max-w-5xl print:max-w-none">{children}</div>
      </main>
    </div>
  );
}
