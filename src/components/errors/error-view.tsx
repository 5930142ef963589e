import { Navigate, useLocation } from 'react-router-dom';
import { paths } from '../../app/paths';
import { errorMessage, isNotFound, isSignedOut } from '../../lib/error-messages';
import { isApiError } from '../../lib/api-client';
import { Alert } from '../ui/alert';
import { Button } from '../ui/button';
import { NotFoundView } from './not-found-view';

/**
 * One way of showing a failure wherever it is caught: not found looks like the not-found page,
 * a lost session goes to sign-in, anything else says what happened and offers to try again.
 */
export function ErrorView({ error, onRetry, what = 'this page' }: { error: unknown; onRetry?: () => void; what?: string }) {
  const location = useLocation();
  if (isNotFound(error)) return <NotFoundView />;
  if (isSignedOut(error)) return <Navigate replace to={paths.signIn.getHref(location.pathname + location.search)} />;
  const forbidden = isApiError(error) && error.status === 403;
  return (
    <div className="py-6">
      <Alert
        tone="fault"
        title={forbidden ? 'Not allowed' : `Headroom could not show ${what}`}
        actions={
          onRetry && !forbidden ? (
            <Button variant="secondary" onClick={onRetry}>
              Try again
            </Button>
          ) : null
        }
      >
        {errorMessage(error)}
      </Alert>
    </div>
  );
}
