import { Component } from 'react';
import type { ComponentType, ErrorInfo, ReactNode } from 'react';
import { QueryErrorResetBoundary } from '@tanstack/react-query';
import { useLocation, useRouteError } from 'react-router-dom';
import { ErrorView } from './error-view';

type BoundaryProps = {
  children: ReactNode;
  /** a change of this key (the address) clears the error */
  resetKey: string;
  onReset: () => void;
  fallback: (error: unknown, retry: () => void) => ReactNode;
};

class ErrorBoundary extends Component<BoundaryProps, { error: unknown; failed: boolean }> {
  override state = { error: null as unknown, failed: false };

  static getDerivedStateFromError(error: unknown) {
    return { error, failed: true };
  }

  override componentDidCatch(error: unknown, info: ErrorInfo) {
    console.error('A page failed to render', error, info.componentStack);
  }

  override componentDidUpdate(previous: BoundaryProps) {
    if (this.state.failed && previous.resetKey !== this.props.resetKey) this.retry();
  }

  retry = () => {
    this.props.onReset();
    this.setState({ error: null, failed: false });
  };

  override render() {
    return this.state.failed ? this.props.fallback(this.state.error, this.retry) : this.props.children;
  }
}

/**
 * Wraps one major route: a failure while rendering it is shown inside the app shell, the rest
 * of the app keeps working, and "Try again" also re-runs failed queries.
 */
export function RouteErrorBoundary({ children, what }: { children: ReactNode; what?: string }) {
  const location = useLocation();
  return (
    <QueryErrorResetBoundary>
      {({ reset }) => (
        <ErrorBoundary resetKey={location.pathname} onReset={reset} fallback={(error, retry) => <ErrorView error={error} onRetry={retry} what={what} />}>
          {children}
        </ErrorBoundary>
      )}
    </QueryErrorResetBoundary>
  );
}

/** For the router's own `errorElement`: failures outside any page (the shell itself). */
export function RouterErrorView() {
  const error = useRouteError();
  return (
    <main className="mx-auto max-w-page px-6 py-10">
      <ErrorView error={error} onRetry={() => window.location.reload()} what="Headroom" />
    </main>
  );
}

/** A lazily loaded page wrapped in its own boundary, so one failing page leaves the shell working. */
export function guarded(what: string, Page: ComponentType): ComponentType {
  return function GuardedPage() {
    return (
      <RouteErrorBoundary what={what}>
        <Page />
      </RouteErrorBoundary>
    );
  };
}
