import { useCallback, useState } from 'react';

export type ThemeChoice = 'system' | 'light' | 'dark';

const storageKey = 'tappet.theme';

function readChoice(): ThemeChoice {
  try {
    const value = window.localStorage.getItem(storageKey);
    return value === 'light' || value === 'dark' ? value : 'system';
  } catch {
    return 'system';
  }
}

function apply(choice: ThemeChoice) {
  const root = document.documentElement;
  if (choice === 'system') delete root.dataset.theme;
  else root.dataset.theme = choice;
}

/** Applies the stored theme choice; call once before the first render to avoid a flash. */
export function applyStoredTheme(): void {
  apply(readChoice());
}

/**
 * The person's theme choice: follow the system (prefers-color-scheme), or force light or dark
 * (a dim workshop with a bright-themed tablet). Stored on this device only.
 */
export function useTheme(): [ThemeChoice, (choice: ThemeChoice) => void] {
  const [choice, setChoice] = useState<ThemeChoice>(readChoice);
  const update = useCallback((next: ThemeChoice) => {
    try {
      if (next === 'system') window.localStorage.removeItem(storageKey);
      else window.localStorage.setItem(storageKey, next);
    } catch {
      // Private mode or storage disabled: the choice lasts for this page only.
    }
    apply(next);
    setChoice(next);
  }, []);
  return [choice, update];
}
