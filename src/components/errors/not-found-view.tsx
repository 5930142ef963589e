import { Link } from 'react-router-dom';
import { paths } from '../../app/paths';
import { useDocumentTitle } from '../../hooks/use-document-title';

/** Shown for unknown addresses and for projects the person is not a member of (the two look the same on purpose). */
export function NotFoundView() {
  useDocumentTitle('Not found');
  return (
    <div className="py-10" data-testid="not-found">
      <h1 className="text-3xl">Not found</h1>
      <p className="mt-3 max-w-prose text-ink-soft">
        There is nothing at this address, or it belongs to a project you are not a member of. If you expected to see a project here, ask its designer to add
        you.
      </p>
      <p className="mt-6">
        <Link to={paths.projects.getHref()}>Go to your projects</Link>
      </p>
    </div>
  );
}
