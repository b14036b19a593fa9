import { createBrowserRouter } from 'react-router';
import { AppShell } from './components/app-shell';
import AccountRoute from './routes/account';
import EditorsRoute from './routes/editors';
import EditorsOverviewRoute from './routes/editors-overview';
import EditorsPeopleRoute from './routes/editors-people';
import HomeRoute from './routes/home';
import NotFoundRoute from './routes/not-found';
import SignInRoute from './routes/sign-in';
import SignUpRoute from './routes/sign-up';

/** Every page of the client. Route files stay thin: they compose features. */
export const routes = [
  {
    element: <AppShell />,
    children: [
      { index: true, element: <HomeRoute /> },
      { path: 'sign-in', element: <SignInRoute /> },
      { path: 'sign-up', element: <SignUpRoute /> },
      { path: 'account', element: <AccountRoute /> },
      {
        path: 'editors',
        element: <EditorsRoute />,
        children: [
          { index: true, element: <EditorsOverviewRoute /> },
          { path: 'people', element: <EditorsPeopleRoute /> },
        ],
      },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);
