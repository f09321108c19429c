import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router-dom';
// Open Sans ships with the app: Latin and Latin Extended only, three weights.
import '@fontsource/open-sans/latin-400.css';
import '@fontsource/open-sans/latin-ext-400.css';
import '@fontsource/open-sans/latin-600.css';
import '@fontsource/open-sans/latin-ext-600.css';
import '@fontsource/open-sans/latin-700.css';
import './theme/global.css';
import { Providers } from './app/providers';
import { router } from './app/router';
import { setUnauthenticatedHandler } from './lib/api-client';
import { queryClient } from './lib/query-client';
import { getMeQueryOptions } from './features/auth/api/get-me';

// When any request finds the session gone, go to sign-in and come back here afterwards.
setUnauthenticatedHandler(() => {
  queryClient.setQueryData(getMeQueryOptions().queryKey, null);
  const here = window.location.pathname + window.location.search;
  if (!window.location.pathname.startsWith('/sign-in')) void router.navigate(`/sign-in?next=${encodeURIComponent(here)}`);
});

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <Providers>
      <RouterProvider router={router} />
    </Providers>
  </StrictMode>,
);
