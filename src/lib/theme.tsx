import { createContext, useCallback, useContext, useEffect, useMemo, useState, type ReactNode } from 'react';

export type Theme = 'day' | 'night';

const STORAGE_KEY = 'starledger.theme';
const DIM_KEY = 'starledger.dim';

/** The remembered theme; read before the first render so the night theme never flashes paper-white at the telescope. */
export function readStoredTheme(): Theme {
  try {
    return window.localStorage.getItem(STORAGE_KEY) === 'night' ? 'night' : 'day';
  } catch {
    return 'day';
  }
}

/** Whether the observer last chose to dim the night theme on this device. */
export function readStoredDim(): boolean {
  try {
    return window.localStorage.getItem(DIM_KEY) === 'on';
  } catch {
    return false;
  }
}

/** The dimmer only exists in the night theme (src/styles/index.css dims [data-theme="night"][data-dim="on"]). */
export function applyTheme(theme: Theme, dim = false): void {
  document.documentElement.dataset.theme = theme;
  document.documentElement.dataset.dim = theme === 'night' && dim ? 'on' : 'off';
}

interface ThemeContextValue {
  theme: Theme;
  setTheme: (theme: Theme) => void;
  toggleTheme: () => void;
  /** The night theme's dimmer, remembered separately so switching themes keeps the observer's choice. */
  dim: boolean;
  toggleDim: () => void;
}

const ThemeContext = createContext<ThemeContextValue | null>(null);

export function ThemeProvider({ children }: { children: ReactNode }) {
  const [theme, setThemeState] = useState<Theme>(readStoredTheme);
  const [dim, setDim] = useState<boolean>(readStoredDim);

  useEffect(() => {
    applyTheme(theme, dim);
    try {
      window.localStorage.setItem(STORAGE_KEY, theme);
      window.localStorage.setItem(DIM_KEY, dim ? 'on' : 'off');
    } catch {
      // Private windows may refuse storage; the theme still applies for this visit.
    }
  }, [theme, dim]);

  const setTheme = useCallback((next: Theme) => setThemeState(next), []);
  const toggleTheme = useCallback(() => setThemeState((t) => (t === 'night' ? 'day' : 'night')), []);
  const toggleDim = useCallback(() => setDim((d) => !d), []);
  const value = useMemo(() => ({ theme, setTheme, toggleTheme, dim, toggleDim }), [theme, setTheme, toggleTheme, dim, toggleDim]);

  return <ThemeContext.Provider value={value}>{children}</ThemeContext.Provider>;
}

export function useTheme(): ThemeContextValue {
  const value = useContext(ThemeContext);
  if (!value) throw new Error('useTheme must be used inside ThemeProvider.');
  return value;
}
