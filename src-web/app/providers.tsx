import { FluentProvider, Toaster, useId } from '@fluentui/react-components';
import { QueryClientProvider } from '@tanstack/react-query';
import { createContext, useContext, type ReactNode } from 'react';
import { queryClient } from '../lib/query-client';
import { darkTheme, lightTheme } from '../theme/theme';
import { ThemeModeProvider, useThemeMode } from '../theme/theme-mode';

const ToasterCtx = createContext<string>('toaster');
export const useToasterId = () => useContext(ToasterCtx);

function Themed({ children }: { children: ReactNode }) {
  const { mode } = useThemeMode();
  const toasterId = useId('toaster');
  return (
    <FluentProvider theme={mode === 'dark' ? darkTheme : lightTheme} style={{ minHeight: '100vh' }}>
      <ToasterCtx.Provider value={toasterId}>
        {children}
        <Toaster toasterId={toasterId} position="top-end" />
      </ToasterCtx.Provider>
    </FluentProvider>
  );
}

export function Providers({ children }: { children: ReactNode }) {
  return (
    <QueryClientProvider client={queryClient}>
      <ThemeModeProvider>
        <Themed>{children}</Themed>
      </ThemeModeProvider>
    </QueryClientProvider>
  );
}
