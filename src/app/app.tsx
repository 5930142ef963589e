import { useState } from 'react';
import { RouterProvider } from 'react-router-dom';
import { AppProvider, createAppQueryClient } from './provider';
import { createRouter } from './router';

export function App() {
  // one query client for the router's loaders and the pages' queries, so a loader's fetch is the page's
  const [queryClient] = useState(createAppQueryClient);
  const [router] = useState(() => createRouter(queryClient));
  return (
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>
  );
}
