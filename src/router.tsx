import { createBrowserRouter } from 'react-router';
import { AppShell } from './components/app-shell';
import { lazyPage } from './components/lazy-page';

// Every page is its own chunk, fetched when first opened (the map, charts, editors' workspace and forms
// are large): the first screen loads only the shell and its own page. index.html preloads the atlas.
const AccountRoute = lazyPage(() => import('./routes/account'));
const DevMailRoute = lazyPage(() => import('./routes/dev-mail'));
const EditorsRoute = lazyPage(() => import('./routes/editors'));
const ForgotPasswordRoute = lazyPage(() => import('./routes/forgot-password'));
const EditorsOverviewRoute = lazyPage(() => import('./routes/editors-overview'));
const EditorsPeopleRoute = lazyPage(() => import('./routes/editors-people'));
const EditorsVarietiesRoute = lazyPage(() => import('./routes/editors-varieties'));
const EditorsWaspAreasRoute = lazyPage(() => import('./routes/editors-wasp-areas'));
const EditorsModerationRoute = lazyPage(() => import('./routes/editors-moderation'));
const EditorsAuditRoute = lazyPage(() => import('./routes/editors-audit'));
const EditorsStationsRoute = lazyPage(() => import('./routes/editors-stations'));
const HereRoute = lazyPage(() => import('./routes/here'));
const HomeRoute = lazyPage(() => import('./routes/home'));
const MyReportsRoute = lazyPage(() => import('./routes/my-reports'));
const NotFoundRoute = lazyPage(() => import('./routes/not-found'));
const ReportDetailRoute = lazyPage(() => import('./routes/report-detail'));
const ReportEditRoute = lazyPage(() => import('./routes/report-edit'));
const ReportImportRoute = lazyPage(() => import('./routes/report-import'));
const ReportNewRoute = lazyPage(() => import('./routes/report-new'));
const ResetPasswordRoute = lazyPage(() => import('./routes/reset-password'));
const SignInRoute = lazyPage(() => import('./routes/sign-in'));
const SignUpRoute = lazyPage(() => import('./routes/sign-up'));
const UnsubscribeRoute = lazyPage(() => import('./routes/unsubscribe'));
const VerifyRoute = lazyPage(() => import('./routes/verify'));
const WhyNoFigsRoute = lazyPage(() => import('./routes/why-no-figs'));
const AccuracyRoute = lazyPage(() => import('./routes/accuracy'));
const SupportRoute = lazyPage(() => import('./routes/support'));
const SupportThanksRoute = lazyPage(() => import('./routes/support-thanks'));
const EditorsSupportersRoute = lazyPage(() => import('./routes/editors-supporters'));
const VarietyRoute = lazyPage(() => import('./routes/variety'));
const HereCompareRoute = lazyPage(() => import('./routes/here-compare'));
const AboutRoute = lazyPage(() => import('./routes/about'));

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
      { path: 'here/compare', element: <HereCompareRoute /> },
      { path: 'varieties/:id', element: <VarietyRoute /> },
      { path: 'why-no-figs', element: <WhyNoFigsRoute /> },
      { path: 'accuracy', element: <AccuracyRoute /> },
      { path: 'verify', element: <VerifyRoute /> },
      { path: 'forgot-password', element: <ForgotPasswordRoute /> },
      { path: 'reset-password', element: <ResetPasswordRoute /> },
      { path: 'unsubscribe', element: <UnsubscribeRoute /> },
      { path: 'dev/mail', element: <DevMailRoute /> },
      { path: 'support', element: <SupportRoute /> },
      { path: 'support/thanks', element: <SupportThanksRoute /> },
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
          { path: 'supporters', element: <EditorsSupportersRoute /> },
        ],
      },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);

/**
 * The atlas home's code (index.html preloads it): awaited before the first render on `/`, so the
 * first paint is the page itself, with its pin preview, rather than a "Loading…" line first.
 */
export const preloadAtlasHome = () => HomeRoute.preload();
