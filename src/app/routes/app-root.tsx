import { Navigate, Outlet, useLocation, useNavigate } from 'react-router-dom';
import { AppShell } from '../../components/layout/app-shell';
import { InboxNavLink } from '../../features/inbox/components/inbox-nav-link';
import type { NavItem } from '../../components/layout/app-shell';
import { ErrorView } from '../../components/errors/error-view';
import { Button } from '../../components/ui/button';
import { Loading } from '../../components/ui/loading';
import { useMe } from '../../features/auth/api/get-me';
import { useSignOut } from '../../features/auth/api/sign-out';
import { ROLE_LABELS } from '../../lib/labels';
import type { User } from '../../shared/api/auth';
import { paths } from '../paths';

function navFor(user: User): NavItem[] {
  const items: NavItem[] = [{ to: paths.projects.getHref(), label: 'Projects' }];
  if (user.isAdmin) items.push({ to: paths.users.getHref(), label: 'Users' });
  return items;
}

function Person({ user }: { user: User }) {
  const signOut = useSignOut();
  const navigate = useNavigate();
  const roles = [ROLE_LABELS[user.accountRole], user.isAdmin ? 'Administrator' : null].filter(Boolean).join(', ');
  return (
    <>
      <p className="text-sm" data-testid="signed-in-as">
        <span className="sr-only">Signed in as </span>
        <span className="font-semibold">{user.name}</span>
        <span className="text-paper/90"> · {roles}</span>
      </p>
      <Button
        variant="inverse"
        pending={signOut.isPending}
        pendingLabel="Signing out…"
        onClick={() => signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn.getHref(), { replace: true }) })}
      >
        Sign out
      </Button>
    </>
  );
}

/** The signed-in area: waits for the session, sends anyone signed out to sign-in, then shows the shell. */
export function AppRoot() {
  const me = useMe();
  const location = useLocation();

  if (me.isPending) {
    return (
      <div className="mx-auto max-w-page px-6">
        <Loading label="Opening Headroom…" />
      </div>
    );
  }
  if (me.isError) {
    return (
      <div className="mx-auto max-w-page px-6">
        <ErrorView error={me.error} onRetry={() => void me.refetch()} what="your session" />
      </div>
    );
  }
  if (!me.data) return <Navigate replace to={paths.signIn.getHref(location.pathname + location.search)} />;

  return (
    <AppShell nav={navFor(me.data)} person={<Person user={me.data} />} extraNav={<InboxNavLink />}>
      <Outlet />
    </AppShell>
  );
}
