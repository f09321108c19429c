import { createContext, useContext, useEffect, useMemo, useState, type ReactNode } from 'react';

export type ThemeMode = 'light' | 'dark';
const KEY = 'yokeline.theme';

interface ThemeModeValue {
  mode: ThemeMode;
  setMode: (m: ThemeMode) => void;
}
const Ctx = createContext<ThemeModeValue>({ mode: 'light', setMode: () => undefined });

function initial(): ThemeMode {
  const saved = typeof localStorage !== 'undefined' ? localStorage.getItem(KEY) : null;
  if (saved === 'light' || saved === 'dark') return saved;
  return typeof matchMedia !== 'undefined' && matchMedia('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
}

/** Light or dark, remembered in this browser. */
export function ThemeModeProvider({ children }: { children: ReactNode }) {
  const [mode, setMode] = useState<ThemeMode>(initial);
  useEffect(() => {
    localStorage.setItem(KEY, mode);
    document.documentElement.dataset.theme = mode;
  }, [mode]);
  const value = useMemo(() => ({ mode, setMode }), [mode]);
  return <Ctx.Provider value={value}>{children}</Ctx.Provider>;
}

export const useThemeMode = (): ThemeModeValue => useContext(Ctx);
