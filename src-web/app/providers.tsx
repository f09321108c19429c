import { FluentProvider, useFocusFinders } from '@fluentui/react-components';
import { QueryClientProvider } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { queryClient } from '../lib/query-client';
import { darkTheme, lightTheme } from '../theme/theme';
import { ThemeModeProvider, useThemeMode } from '../theme/theme-mode';

/**
 * Keeps Fluent's focus manager (tabster) alive for the life of the app. It is reference-counted
 * by the components that use it; when a page whose open dialog was the last user unmounts (the
 * receive form navigating to the new lot), tabster is disposed before it removes the
 * aria-hidden its modal set on the app root, and the whole page drops out of the accessibility
 * tree (tabster issue #530: ModalizerAPI.dispose clears its pending update without running it).
 */
function KeepFocusManager() {
  useFocusFinders();
  return null;
}

function Themed({ children }: { children: ReactNode }) {
  const { mode } = useThemeMode();
  return (
    <FluentProvider theme={mode === 'dark' ? darkTheme : lightTheme} style={{ minHeight: '100vh' }}>
      <KeepFocusManager />
      {children}
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
