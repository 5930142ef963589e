import { NotFoundView } from '../../components/errors/not-found-view';

export function NotFoundRoute() {
  return <NotFoundView />;
}
