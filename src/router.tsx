import { createBrowserRouter } from 'react-router';
import { AppShell } from './components/app-shell';
import AboutRoute from './routes/about';
import AccountRoute from './routes/account';
import DevMailRoute from './routes/dev-mail';
import EditorsRoute from './routes/editors';
import ForgotPasswordRoute from './routes/forgot-password';
import EditorsOverviewRoute from './routes/editors-overview';
import EditorsPeopleRoute from './routes/editors-people';
import EditorsVarietiesRoute from './routes/editors-varieties';
import EditorsWaspAreasRoute from './routes/editors-wasp-areas';
import EditorsModerationRoute from './routes/editors-moderation';
import EditorsAuditRoute from './routes/editors-audit';
import EditorsStationsRoute from './routes/editors-stations';
import HereRoute from './routes/here';
import HomeRoute from './routes/home';
import MyReportsRoute from './routes/my-reports';
import NotFoundRoute from './routes/not-found';
import ReportDetailRoute from './routes/report-detail';
import ReportEditRoute from './routes/report-edit';
import ReportImportRoute from './routes/report-import';
import ReportNewRoute from './routes/report-new';
import ResetPasswordRoute from './routes/reset-password';
import SignInRoute from './routes/sign-in';
import SignUpRoute from './routes/sign-up';
import UnsubscribeRoute from './routes/unsubscribe';
import VerifyRoute from './routes/verify';
import WhyNoFigsRoute from './routes/why-no-figs';

/** Every page of the client. Route files stay thin: they compose features. */
export const routes = [
  {
    element: <AppShell />,
    children: [
      { index: true, element: <HomeRoute /> },
      { path: 'about', element: <AboutRoute /> },
      { path: 'sign-in', element: <SignInRoute /> },
      { path: 'sign-up', element: <SignUpRoute /> },
      { path: 'account', element: <AccountRoute /> },
      { path: 'reports/new', element: <ReportNewRoute /> },
      { path: 'reports/:id', element: <ReportDetailRoute /> },
      { path: 'reports/:id/edit', element: <ReportEditRoute /> },
      { path: 'my/reports', element: <MyReportsRoute /> },
      { path: 'my/reports/import', element: <ReportImportRoute /> },
      { path: 'here', element: <HereRoute /> },
      { path: 'why-no-figs', element: <WhyNoFigsRoute /> },
      { path: 'verify', element: <VerifyRoute /> },
      { path: 'forgot-password', element: <ForgotPasswordRoute /> },
      { path: 'reset-password', element: <ResetPasswordRoute /> },
      { path: 'unsubscribe', element: <UnsubscribeRoute /> },
      { path: 'dev/mail', element: <DevMailRoute /> },
      {
        path: 'editors',
        element: <EditorsRoute />,
        children: [
          { index: true, element: <EditorsOverviewRoute /> },
          { path: 'people', element: <EditorsPeopleRoute /> },
          { path: 'varieties', element: <EditorsVarietiesRoute /> },
          { path: 'wasp-areas', element: <EditorsWaspAreasRoute /> },
          { path: 'stations/:stationId?', element: <EditorsStationsRoute /> },
          { path: 'moderation', element: <EditorsModerationRoute /> },
          { path: 'audit', element: <EditorsAuditRoute /> },
        ],
      },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);
