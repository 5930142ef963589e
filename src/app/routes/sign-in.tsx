import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { PlainShell } from '../../components/layout/app-shell';
import { Loading } from '../../components/ui/loading';
import { useMe } from '../../features/auth/api/get-me';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { useDocumentTitle } from '../../hooks/use-document-title';
import { isSafeRedirect, paths } from '../paths';

export function SignInRoute() {
  useDocumentTitle('Sign in');
  const me = useMe();
  const navigate = useNavigate();
  const [search] = useSearchParams();
  const requested = search.get('redirectTo');
  const target = requested && isSafeRedirect(requested) ? requested : paths.projects.getHref();

  if (me.isPending) return <Loading />;
  if (me.data) return <Navigate replace to={target} />;

  return (
    <PlainShell>
      <h1 className="mb-2 text-2xl">Sign in</h1>
      <p className="mb-6 text-sm text-ink-soft">Use the e-mail address your administrator registered for you.</p>
      <SignInForm onSignedIn={() => navigate(target, { replace: true })} />
    </PlainShell>
  );
}
