import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { paths } from '@/config/paths';
import { AppLayout } from '@/components/layouts/app-layout';
import { RouteError } from './routes/route-error';

const router = createBrowserRouter([
  {
    path: paths.signIn.pattern,
    lazy: async () => ({ Component: (await import('./routes/sign-in')).default }),
    errorElement: <RouteError />,
  },
  {
    path: paths.setPassword.pattern,
    lazy: async () => ({ Component: (await import('./routes/set-password')).default }),
    errorElement: <RouteError />,
  },
  {
    Component: AppLayout,
    errorElement: <RouteError />,
    children: [
      { index: true, lazy: async () => ({ Component: (await import('./routes/home')).default }) },
      { path: paths.people.pattern, lazy: async () => ({ Component: (await import('./routes/admin/people')).default }) },
      { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found')).default }) },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
