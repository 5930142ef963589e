import { NavLink } from 'react-router-dom';
import { cx } from '../../../components/ui/cx';
import { useCurrentUser } from '../../auth/api/use-current-user';
import { summaryPaths } from '../../summaries/paths';
import { isAwaitingDecision, useInbox } from '../api/get-inbox';

/** The same look as the app shell's other main-navigation links. */
function navClass({ isActive }: { isActive: boolean }) {
  return cx(
    'inline-flex items-center gap-2 rounded-md px-3 py-2 font-semibold no-underline text-paper hover:bg-standpipe-strong hover:text-paper',
    isActive && 'bg-standpipe-strong underline underline-offset-4 decoration-2 decoration-copper-light',
  );
}

/**
 * "Review inbox" in the main navigation, with the number of received summaries awaiting a
 * decision. Shown to inspectors (by account), and to anyone who has received a summary.
 */
export function InboxNavLink() {
  const user = useCurrentUser();
  const inbox = useInbox();
  const items = inbox.data ?? [];
  if (user.accountRole !== 'inspector' && items.length === 0) return null;
  const waiting = items.filter(isAwaitingDecision).length;
  return (
    <NavLink to={summaryPaths.inbox.getHref()} className={navClass} data-testid="inbox-nav-link">
      <span>Review inbox</span>
      {waiting > 0 ? (
        <span className="rounded-full bg-copper-light px-2 text-sm font-bold text-standpipe-strong">
          {waiting}
          <span className="sr-only"> awaiting a decision</span>
        </span>
      ) : null}
    </NavLink>
  );
}
