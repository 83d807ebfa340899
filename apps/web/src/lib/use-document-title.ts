import { useEffect } from 'react';

/** Sets the tab's title to "<title> · Tappet", so tabs and screen readers say where you are. */
export function useDocumentTitle(title: string): void {
  useEffect(() => {
    document.title = title ? `${title} · Tappet` : 'Tappet';
  }, [title]);
}
