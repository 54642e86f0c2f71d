/** Light, dark, or the system's choice; kept in localStorage and applied as the `dark` class. */
export type ThemeChoice = 'light' | 'dark' | 'system';
const KEY = 'longtail.theme';

export function storedTheme(): ThemeChoice {
  const value = typeof localStorage === 'undefined' ? null : localStorage.getItem(KEY);
  return value === 'light' || value === 'dark' ? value : 'system';
}

export function applyTheme(choice: ThemeChoice): void {
  const dark = choice === 'dark' || (choice === 'system' && window.matchMedia?.('(prefers-color-scheme: dark)').matches);
  document.documentElement.classList.toggle('dark', Boolean(dark));
  if (choice === 'system') localStorage.removeItem(KEY);
  else localStorage.setItem(KEY, choice);
}
