import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { Layout } from './layout';

// Route modules are lazy: each exports `Component`.
const router = createBrowserRouter([
  {
    element: <Layout />,
    children: [
      { path: '/', lazy: () => import('./routes/home') },
      { path: '/catalogue', lazy: () => import('./routes/catalogue') },
      { path: '/compare', lazy: () => import('./routes/compare') },
      { path: '/compare/scaling', lazy: () => import('./routes/scaling') },
      { path: '/compare/:id', lazy: () => import('./routes/compare') },
      { path: '/sign-in', lazy: () => import('./routes/sign-in') },
      { path: '/sign-up', lazy: () => import('./routes/sign-up') },
      { path: '/check-email', lazy: () => import('./routes/check-email') },
      { path: '/forgot-password', lazy: () => import('./routes/forgot-password') },
      { path: '/reset-password', lazy: () => import('./routes/reset-password') },
      { path: '/account', lazy: () => import('./routes/account') },
      { path: '/labs', lazy: () => import('./routes/my-labs') },
      { path: '/labs/new', lazy: () => import('./routes/create-lab') },
      { path: '/labs/:slug', lazy: () => import('./routes/lab') },
      { path: '/labs/:slug/about', lazy: () => import('./routes/lab-profile') },
      { path: '/labs/:slug/storage', lazy: () => import('./routes/lab-storage') },
      { path: '/labs/:slug/datasets', lazy: () => import('./routes/lab-datasets') },
      { path: '/labs/:slug/datasets/new', lazy: () => import('./routes/new-dataset') },
      { path: '/labs/:slug/review', lazy: () => import('./routes/review-queue') },
      { path: '/labs/:slug/access-requests', lazy: () => import('./routes/lab-access-requests') },
      { path: '/labs/:slug/audit', lazy: () => import('./routes/lab-audit') },
      { path: '/labs/:slug/drafts/:draftId', lazy: () => import('./routes/draft') },
      { path: '/labs/:slug/drafts/:draftId/files/:fileId', lazy: () => import('./routes/draft-file') },
      { path: '/invitations/:id', lazy: () => import('./routes/invitation') },
      { path: '/admin/users', lazy: () => import('./routes/admin-users') },
      { path: '/admin/labs', lazy: () => import('./routes/admin-labs') },
      { path: '/admin/plans', lazy: () => import('./routes/admin-plans') },
      { path: '/admin/audit', lazy: () => import('./routes/admin-audit') },
      { path: '/releases/:suffix', lazy: () => import('./routes/release') },
      { path: '/datasets/:suffix', lazy: () => import('./routes/dataset-landing') },
      { path: '/api-docs', lazy: () => import('./routes/api-docs') },
      { path: '/dev/mailbox', lazy: () => import('./routes/mailbox') },
      { path: '*', lazy: () => import('./routes/not-found') },
    ],
  },
]);

export const AppRouter = () => <RouterProvider router={router} />;
