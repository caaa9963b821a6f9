import type { ReactNode } from 'react';
import { Outlet, useNavigation } from 'react-router-dom';
import { useSession } from '../../features/auth/api/get-session';
import { CareCaution } from '../../components/CareCaution';
import { Button } from '../../components/ui/Button';
import { ErrorNotice } from '../../components/ui/Notice';
import { Loading } from '../../components/ui/Panel';
import { Brand } from './Brand';

/**
 * Every page: a skip link, the session loaded before anything else (it carries the CSRF token),
 * and the standing caution in the footer. Offline, the session kept from the last visit
 * (lib/offline-copy.ts) stands in until the server answers.
 */
export function RootLayout() {
  const session = useSession();
  const navigation = useNavigation();
  return (
    <div className="flex min-h-screen flex-col">
      {/* The next screen's code is on its way; the current screen stays until it arrives. Present only
          then, so it is never a second status beside a form's own. */}
      {navigation.state === 'loading' && (
        <p role="status" aria-live="polite" className="sr-only">
          Loading…
        </p>
      )}
      <a
        href="#main"
        className="sr-only rounded bg-ink px-3 py-2 text-paper focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-10"
      >
        Skip to content
      </a>
      <div className="flex-1">
        {session.isPending ? (
          <CenteredShell>
            <Loading what="Loadline" />
          </CenteredShell>
        ) : session.isError && !session.data ? (
          <CenteredShell>
            <ErrorNotice error={session.error} title="Loadline could not start" />
            <Button className="mt-3" variant="secondary" onClick={() => void session.refetch()}>
              Try again
            </Button>
          </CenteredShell>
        ) : (
          <Outlet />
        )}
      </div>
      <CautionFooter />
    </div>
  );
}

function CautionFooter() {
  return (
    <footer className="border-t border-rule px-4 py-3">
      <div className="mx-auto max-w-6xl">
        <CareCaution />
      </div>
    </footer>
  );
}

/**
 * While the first screen's code loads: the same frame and words as while the session loads, footer
 * included. index.html carries this same markup (starting-shell.ts), so it shows as soon as the page and
 * its style sheet arrive, before any script has run (a fast first load on a slow phone).
 */
export function StartingUp() {
  return (
    <div className="flex min-h-screen flex-col">
      <div className="flex-1">
        <CenteredShell>
          <Loading what="Loadline" />
        </CenteredShell>
      </div>
      <CautionFooter />
    </div>
  );
}

/** A narrow single column under a plain header, for signing in, accepting an invitation and errors. */
export function CenteredShell({ children }: { children: ReactNode }) {
  return (
    <>
      <header className="border-b border-rule bg-sheet px-4 py-3">
        <div className="mx-auto max-w-6xl">
          <Brand />
        </div>
      </header>
      <main id="main" tabIndex={-1} className="mx-auto w-full max-w-md px-4 py-8 focus:outline-none">
        {children}
      </main>
    </>
  );
}
