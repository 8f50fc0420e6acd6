import '@fontsource/fira-sans/400.css';
import '@fontsource/fira-sans/500.css';
import '@fontsource/fira-sans/600.css';
import './index.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router';
import { AppProvider } from './app/provider';
import { createAppRouter } from './app/router';
import { createQueryClient } from './lib/query-client';

// Query client and router first: the router starts the page's code and data requests right away.
const queryClient = createQueryClient();
const router = createAppRouter(queryClient);

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <AppProvider client={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>
  </StrictMode>,
);
