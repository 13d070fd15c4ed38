import '@fontsource/lato/400.css';
import '@fontsource/lato/400-italic.css';
import '@fontsource/lato/700.css';
import './styles.css';

import { QueryClientProvider } from '@tanstack/react-query';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { setPrefetchClient } from './api/prefetch';
import { createQueryClient } from './api/queryClient';
import { routes } from './routes/routeTable';

const queryClient = createQueryClient();
setPrefetchClient(queryClient);
const router = createBrowserRouter(routes);

const container = document.getElementById('root');
if (!container) throw new Error('main: no #root element in index.html');

createRoot(container).render(
  <StrictMode>
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  </StrictMode>,
);
