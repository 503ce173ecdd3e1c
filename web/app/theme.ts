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

/**
 * Applies the chosen theme to the document and keeps it applied when the choice or the system's
 * setting changes. 'system' resolves to sunlight when the system asks for more contrast, to night in
 * dark mode, and to the plain light theme otherwise.
 */
export function applyTheme(): void {
  const dark = matchMedia('(prefers-color-scheme: dark)');
  const contrast = matchMedia('(prefers-contrast: more)');
  const apply = () => {
    const choice = themeChoice.get();
    const theme = choice !== 'system' ? choice : contrast.matches ? 'sunlight' : dark.matches ? 'night' : 'day';
    document.documentElement.dataset.theme = theme;
    document.querySelector('meta[name="theme-color"]')?.setAttribute('content', getComputedStyle(document.documentElement).getPropertyValue('--primary').trim() || '#0d4a5c');
  };
  apply();
  dark.addEventListener('change', apply);
  contrast.addEventListener('change', apply);
  themeChoice.subscribe((choice) => {
    apply();
    try {
      localStorage.setItem(KEY, choice);
    } catch {
      // Private mode without storage: the choice lasts for this visit only.
    }
  });
}
