/**
 * Light and dark themes: the visitor's choice is remembered in localStorage; until they choose,
 * the system's prefers-color-scheme decides. The `dark` class on <html> switches Tailwind's dark variant.
 */
export type Theme = 'light' | 'dark';
export const THEME_STORAGE_KEY = 'lariat-theme';

export function storedTheme(): Theme | null {
  try {
    const value = localStorage.getItem(THEME_STORAGE_KEY);
    return value === 'light' || value === 'dark' ? value : null;
  } catch {
    return null; // storage can be disabled; fall back to the system preference
  }
}

export function systemTheme(): Theme {
  return window.matchMedia?.('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
}

export function initialTheme(): Theme {
  return storedTheme() ?? systemTheme();
}

/**
 * Switches the class with transitions paused, so buttons don't fade through unreadable in-between
 * colours (the same trick as next-themes' disableTransitionOnChange): pause, switch, force a style
 * recalculation, resume. The pause is a class with its rule in styles.css, not an injected <style>
 * element, which the content security policy (style-src 'self') would block.
 */
export function applyTheme(theme: Theme): void {
  const root = document.documentElement;
  root.classList.add('theme-switching');
  root.classList.toggle('dark', theme === 'dark');
  root.style.colorScheme = theme;
  void window.getComputedStyle(document.body).color;
  setTimeout(() => root.classList.remove('theme-switching'), 1);
}

export function saveTheme(theme: Theme): void {
  try {
    localStorage.setItem(THEME_STORAGE_KEY, theme);
  } catch {
    // not remembered, but still applied for this visit
  }
}
