import { Button, cn, IconClose, IconMenu, IconSignOut } from '@tappet/ui';
import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { Link, NavLink, useLocation } from 'react-router-dom';
import { Brand } from '../brand';

export interface NavItem {
  to: string;
  label: string;
  icon: ReactNode;
  /** Active only on this exact path (for a home link whose children have their own entries). */
  end?: boolean;
}

export interface AppShellProps {
  homeHref: string;
  nav: NavItem[];
  /** The shop switcher (or whatever names the current context) in the top bar. */
  context?: ReactNode;
  userName: string;
  onSignOut: () => void;
  signingOut?: boolean;
  /** Small controls at the foot of the rail (theme). */
  railFooter?: ReactNode;
  children: ReactNode;
}

/**
 * The signed-in frame: a top bar (shop switcher, the person, sign-out), a narrow rail of
 * capabilities on the left, the page on the right. Below 1024 px it is one column and the rail
 * opens as a menu from the top bar.
 */
export function AppShell({ homeHref, nav, context, userName, onSignOut, signingOut, railFooter, children }: AppShellProps) {
  const [menuOpen, setMenuOpen] = useState(false);
  const navId = useId();
  const location = useLocation();
  const mainRef = useRef<HTMLElement>(null);
  const firstPath = useRef(location.pathname);

  // After moving to another page, put focus at the start of the new content so keyboard and
  // screen-reader users continue from there (a single-page app does not do this by itself).
  useEffect(() => {
    if (location.pathname === firstPath.current) return;
    firstPath.current = '';
    mainRef.current?.focus({ preventScroll: true });
  }, [location.pathname]);

  // A chosen destination closes the menu on small screens.
  const [lastPath, setLastPath] = useState(location.pathname);
  if (lastPath !== location.pathname) {
    setLastPath(location.pathname);
    setMenuOpen(false);
  }

  useEffect(() => {
    if (!menuOpen) return;
    function onKey(event: KeyboardEvent) {
      if (event.key === 'Escape') setMenuOpen(false);
    }
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [menuOpen]);

  return (
    <div className="min-h-screen lg:grid lg:grid-cols-[15.5rem_minmax(0,1fr)] lg:grid-rows-[auto_1fr]">
      <a
        href="#main"
        className="sr-only z-50 rounded-md bg-accent px-4 py-2 text-accent-ink focus:not-sr-only focus:absolute focus:top-2 focus:left-2"
      >
        Skip to content
      </a>
      <header className="sticky top-0 z-30 flex flex-wrap items-center gap-x-4 gap-y-2 border-b-2 border-line bg-surface px-4 py-2 lg:col-span-2 lg:h-16 lg:flex-nowrap">
        <Button
          variant="ghost"
          size="sm"
          className="lg:hidden"
          aria-expanded={menuOpen}
          aria-controls={navId}
          icon={menuOpen ? <IconClose size={20} /> : <IconMenu size={20} />}
          onClick={() => setMenuOpen((open) => !open)}
        >
          Menu
        </Button>
        <Link to={homeHref} className="no-underline" aria-label="Tappet home">
          <Brand compact />
        </Link>
        <div className="flex min-w-0 flex-1 items-center">{context}</div>
        <div className="flex items-center gap-3">
          <p className="max-w-48 truncate" title={userName}>
            <span className="sr-only">Signed in as </span>
            {userName}
          </p>
          <Button variant="secondary" size="sm" icon={<IconSignOut size={18} />} loading={signingOut} onClick={onSignOut}>
            Sign out
          </Button>
        </div>
      </header>
      <nav
        id={navId}
        aria-label="Main"
        className={cn(
          'flex-col justify-between gap-6 border-b-2 border-line bg-surface p-3',
          // On a desk the rail stays in view under the sticky top bar while the page scrolls.
          'lg:sticky lg:top-16 lg:flex lg:h-[calc(100vh-4rem)] lg:self-start lg:overflow-y-auto lg:border-r-2 lg:border-b-0',
          menuOpen ? 'flex' : 'hidden',
        )}
      >
        <ul className="flex flex-col gap-1">
          {nav.map((item) => (
            <li key={item.to}>
              <NavLink
                to={item.to}
                end={item.end}
                className={({ isActive }) =>
                  cn(
                    'flex min-h-touch items-center gap-3 rounded-md border-l-4 px-3 font-bold no-underline',
                    isActive ? 'border-accent bg-accent-soft text-ink' : 'border-transparent text-ink hover:bg-sunk hover:text-ink',
                  )
                }
              >
                <span className="text-accent">{item.icon}</span>
                <span>{item.label}</span>
              </NavLink>
            </li>
          ))}
        </ul>
        {railFooter && <div className="border-t border-line pt-3">{railFooter}</div>}
      </nav>
      <main ref={mainRef} id="main" tabIndex={-1} className="min-w-0 px-4 py-6 focus:outline-none sm:px-8">
        <div className="mx-auto max-w-5xl">{children}</div>
      </main>
    </div>
  );
}
