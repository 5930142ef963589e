import { useEffect } from 'react';

/** Names the browser tab after the page, so that a screen reader announces where the person is. */
export function useDocumentTitle(title: string): void {
  useEffect(() => {
    document.title = title ? `${title} · Headroom` : 'Headroom';
  }, [title]);
}
