import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router-dom';
import { AppProvider } from './app/provider';
import { createRouter } from './app/router';
import { queryClient } from './lib/query-client';
import { applyTheme, storedTheme } from './lib/theme';
import './styles/app.css';

applyTheme(storedTheme());
const router = createRouter(queryClient);

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <AppProvider>
      <RouterProvider router={router} />
    </AppProvider>
  </StrictMode>,
);
