import { useEffect } from 'react';

/** Each page names itself in the tab, so screen-reader users and tab-hoppers know where they are. */
export function DocumentTitle({ title }: { title: string }) {
  useEffect(() => {
    document.title = title ? `${title} · Lariat` : 'Lariat';
  }, [title]);
  return null;
}
