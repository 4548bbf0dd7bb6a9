import { createBrowserRouter } from 'react-router-dom';
import { RootErrorBoundary, RootLayout } from './routes/root';

/** Route modules are lazy so each screen (and the chart library) loads only when opened. */
export const router = createBrowserRouter([
  {
    path: '/',
    element: <RootLayout />,
    errorElement: <RootErrorBoundary />,
    children: [
      { index: true, lazy: async () => ({ Component: (await import('./routes/programs')).default }) },
      { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found')).default }) },
    ],
  },
]);
