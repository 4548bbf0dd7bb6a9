import { createBrowserRouter } from 'react-router-dom';
import { RootErrorBoundary, RootLayout } from './routes/root';

/**
 * Route modules are lazy so each screen (and the chart library) loads only when opened.
 * Everything under `/` needs a signed-in person (`RootLayout` shows the sign-in page otherwise).
 */
export const router = createBrowserRouter([
  { path: '/sign-in', errorElement: <RootErrorBoundary />, lazy: async () => ({ Component: (await import('./routes/sign-in')).default }) },
  {
    path: '/',
    element: <RootLayout />,
    errorElement: <RootErrorBoundary />,
    children: [
      { index: true, lazy: async () => ({ Component: (await import('./routes/programs')).default }) },
      { path: 'programs/:programId', lazy: async () => ({ Component: (await import('./routes/program-trends')).default }) },
      { path: 'programs/:programId/cohorts/:period', lazy: async () => ({ Component: (await import('./routes/cohort')).default }) },
      { path: 'admin/programs', lazy: async () => ({ Component: (await import('./routes/admin/programs')).default }) },
      { path: 'admin/programs/new', lazy: async () => ({ Component: (await import('./routes/admin/program-new')).default }) },
      { path: 'admin/programs/:programId', lazy: async () => ({ Component: (await import('./routes/admin/program')).default }) },
      { path: 'admin/schedules', lazy: async () => ({ Component: (await import('./routes/admin/schedules')).default }) },
      { path: 'admin/audit', lazy: async () => ({ Component: (await import('./routes/admin/audit')).default }) },
      { path: 'admin/users', lazy: async () => ({ Component: (await import('./routes/admin/users')).default }) },
      { path: 'admin/users/:userId', lazy: async () => ({ Component: (await import('./routes/admin/user')).default }) },
      { path: 'programs/:programId/designs', lazy: async () => ({ Component: (await import('./routes/designs')).default }) },
      { path: 'programs/:programId/designs/:designId', lazy: async () => ({ Component: (await import('./routes/design')).default }) },
      { path: 'programs/:programId/runs', lazy: async () => ({ Component: (await import('./routes/runs')).default }) },
      { path: 'admin/mail', lazy: async () => ({ Component: (await import('./routes/admin-mail')).default }) },
      { path: 'admin/mail/:messageId', lazy: async () => ({ Component: (await import('./routes/admin-mail-message')).default }) },
      { path: 'me/summary', lazy: async () => ({ Component: (await import('./routes/my-summary')).default }) },
      { path: 'programs/:programId/extracts', lazy: async () => ({ Component: (await import('./routes/extracts')).default }) },
      { path: 'programs/:programId/extracts/:extractId', lazy: async () => ({ Component: (await import('./routes/extract')).default }) },
      { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found')).default }) },
    ],
  },
]);
