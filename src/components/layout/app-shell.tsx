import { useRef } from 'react';
import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { useFocusOnNavigate } from '../../hooks/use-focus-on-navigate';
import { cx } from '../ui/cx';

export type NavItem = { to: string; label: string };

function navClass({ isActive }: { isActive: boolean }) {
  return cx(
    'rounded-md px-3 py-2 font-semibold no-underline text-paper hover:bg-standpipe-strong hover:text-paper',
    isActive && 'bg-standpipe-strong underline underline-offset-4 decoration-2 decoration-copper-light',
  );
}

/** The frame of every signed-in page: brand, navigation, the person, the content, the standing caution. */
export function AppShell({ nav, person, children, extraNav }: { nav: readonly NavItem[]; person: ReactNode; children: ReactNode; extraNav?: ReactNode }) {
  const main = useRef<HTMLElement>(null);
  useFocusOnNavigate(main);
  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only-focusable bg-copper px-4 py-2 font-semibold text-paper">
        Skip to content
      </a>
      <header className="border-b-4 border-copper bg-standpipe text-paper">
        <div className="mx-auto flex max-w-page flex-wrap items-center justify-between gap-4 px-6 py-3">
          <div className="flex flex-wrap items-center gap-6">
            <span className="text-2xl font-bold tracking-tight" aria-label="Headroom">
              Head<span className="text-copper-light">room</span>
            </span>
            <nav aria-label="Main">
              <ul className="flex flex-wrap gap-1">
                {nav.map((item) => (
                  <li key={item.to}>
                    <NavLink to={item.to} className={navClass}>
                      {item.label}
                    </NavLink>
                  </li>
                ))}
                {extraNav ? <li>{extraNav}</li> : null}
              </ul>
            </nav>
          </div>
          <div className="flex flex-wrap items-center gap-3">{person}</div>
        </div>
      </header>
      <main id="main" ref={main} tabIndex={-1} className="mx-auto w-full max-w-page flex-1 px-6 py-8 focus:outline-none">
        {children}
      </main>
      <footer className="border-t-2 border-rule bg-paper-deep">
        <p className="mx-auto max-w-page px-6 py-4 text-sm text-ink-soft">
          Headroom assists a qualified person. The adopted plumbing code, the authority having jurisdiction, the manufacturers' data and licensed practice
          govern.
        </p>
      </footer>
    </div>
  );
}

/** The frame of the signed-out pages (sign-in, invitation). */
export function PlainShell({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col items-center bg-paper px-4 py-12">
      <p className="mb-8 text-3xl font-bold tracking-tight text-standpipe">
        Head<span className="text-copper">room</span>
      </p>
      <main id="main" className="w-full max-w-md rounded-lg border-2 border-rule bg-surface p-8 shadow-sm">
        {children}
      </main>
      <p className="mt-8 max-w-md text-center text-sm text-ink-soft">
        Headroom checks that every fixture keeps its minimum flow pressure and that static pressure stays under the limit. It assists a qualified person; the
        adopted code and the authority having jurisdiction govern.
      </p>
    </div>
  );
}
