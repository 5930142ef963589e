import { useEffect } from 'react';

/** While `unsaved`, closing or reloading the tab asks first (the browser's own question). */
export function useWarnBeforeLeaving(unsaved: boolean) {
  useEffect(() => {
    if (!unsaved) return;
    const warn = (event: BeforeUnloadEvent) => event.preventDefault();
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [unsaved]);
}
