import { useEffect } from 'react';

export const LEAVE_QUESTION = 'The study has unsaved edits. Leave them? (They stay kept in this browser and are offered back when you return.)';

/**
 * While `dirty`, asks before the page is left (reload, link, closing) and before another tab of
 * the revision workspace is opened. The tab bar belongs to the workspace, so the click is caught
 * on its way down (capture on window) and stopped there when the person stays.
 */
export function useLeaveGuard(dirty: boolean) {
  useEffect(() => {
    if (!dirty) return;
    const beforeUnload = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = LEAVE_QUESTION;
    };
    const onClick = (e: MouseEvent) => {
      const target = (e.target as Element | null)?.closest?.('[role="tab"], a[href]');
      if (!target || target.getAttribute('aria-selected') === 'true') return;
      // Links leave the page: beforeunload asks. Tabs stay on the page, so ask here.
      if (target.tagName === 'A') return;
      if (!window.confirm(LEAVE_QUESTION)) {
        e.preventDefault();
        e.stopPropagation();
      }
    };
    window.addEventListener('beforeunload', beforeUnload);
    window.addEventListener('click', onClick, true);
    return () => {
      window.removeEventListener('beforeunload', beforeUnload);
      window.removeEventListener('click', onClick, true);
    };
  }, [dirty]);
}
