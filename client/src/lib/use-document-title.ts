import { useEffect } from 'react';

/** Names the browser tab after the page, so screen-reader users hear where a navigation landed. */
export function useDocumentTitle(title: string): void {
  useEffect(() => {
    document.title = title ? `${title} · Loadline` : 'Loadline';
  }, [title]);
}
