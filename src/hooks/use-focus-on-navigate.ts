import { useEffect, useRef } from 'react';
import type { RefObject } from 'react';
import { useLocation } from 'react-router-dom';

/**
 * After moving to another page, puts keyboard focus at the start of the new content (as a full
 * page load would), so keyboard and screen-reader users are not left on the old link.
 */
export function useFocusOnNavigate(target: RefObject<HTMLElement | null>): void {
  const { pathname } = useLocation();
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    target.current?.focus({ preventScroll: false });
  }, [pathname, target]);
}
