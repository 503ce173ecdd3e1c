// Colour theme: follow the system (light or dark), or force the high-contrast "sunlight" theme or the
// dark "night" theme. Kept in localStorage: a display preference, not a record.
import { createStore } from '../store';

/** The theme the user chose. */
export type ThemeChoice = 'system' | 'sunlight' | 'night';

const KEY = 'freshet.theme';

function readChoice(): ThemeChoice {
  try {
    const v = localStorage.getItem(KEY);
    return v === 'sunlight' || v === 'night' ? v : 'system';
  } catch {
    return 'system';
  }
}

export const themeChoice = createStore<ThemeChoice>(readChoice());

/** Applies the chosen theme to the document and keeps it applied when the choice changes. */
export function applyTheme(): void {
  const apply = (choice: ThemeChoice) => {
    if (choice === 'system') delete document.documentElement.dataset.theme;
    else document.documentElement.dataset.theme = choice;
  };
  apply(themeChoice.get());
  themeChoice.subscribe((choice) => {
    apply(choice);
    try {
      localStorage.setItem(KEY, choice);
    } catch {
      // Private mode without storage: the choice lasts for this visit only.
    }
  });
}
