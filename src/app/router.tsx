import { lazy, Suspense, type ReactNode } from 'react';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { Loading } from '../components/ui/Page';
import { AcceptInvitationPage } from '../features/auth/components/AcceptInvitationPage';
import { CompletePasswordResetPage } from '../features/auth/components/CompletePasswordResetPage';
import { RequestPasswordResetPage } from '../features/auth/components/RequestPasswordResetPage';
import { SetupPage } from '../features/auth/components/SetupPage';
import { AnomaliesPage } from '../features/anomalies/components/AnomaliesPage';
import { AnomalyDetailPage } from '../features/anomalies/components/AnomalyDetailPage';
import { NewAnomalyPage } from '../features/anomalies/components/NewAnomalyPage';
import { SignInPage } from '../features/auth/components/SignInPage';
import { EngineeringChecksPage } from '../features/hazards/components/EngineeringChecksPage';
import { HazardDetailPage } from '../features/hazards/components/HazardDetailPage';
import { HazardPrintPage, HazardRegisterPrintPage } from '../features/hazards/components/HazardPrintPage';
import { HazardRegisterPage } from '../features/hazards/components/HazardRegisterPage';
import { NewHazardPage } from '../features/hazards/components/NewHazardPage';
import { PropellantCautionsPage, PropellantLibraryPage, PropellantPage } from '../features/hazards/components/PropellantPages';
import { EditRiskMatrixPage, NewRiskMatrixPage } from '../features/hazards/components/RiskMatrixEditPages';
import { RiskMatricesPage, RiskMatrixPage } from '../features/hazards/components/RiskMatrixPages';
import { HomePage } from '../features/home/components/HomePage';
import { MailOutboxPage } from '../features/mail/components/MailOutboxPage';
import { PeoplePage } from '../features/people/components/PeoplePage';
import { CrewPage } from '../features/procedures/components/CrewPage';
import { DiffPage } from '../features/procedures/components/DiffPage';
import { DraftEditorPage } from '../features/procedures/components/DraftEditorPage';
import { ProcedureListPage } from '../features/procedures/components/ProcedureListPage';
import { ProcedurePage } from '../features/procedures/components/ProcedurePage';
import { ProcedurePrintPage } from '../features/procedures/components/ProcedurePrintPage';
import { RevisionPage } from '../features/procedures/components/RevisionPage';
import { StationsPage } from '../features/procedures/components/StationsPage';
import { ProfilePage } from '../features/profile/components/ProfilePage';
import { RecordsPage } from '../features/records/components/RecordsPage';
import { AppShell } from './layout/AppShell';
import { PublicLayout } from './layout/PublicLayout';
import { NotFoundRoute } from './NotFound';
import { RequireRole } from './RequireRole';
import { RootError, RouteError } from './RouteError';

// The live count pulls in socket.io and the count screens: loaded only when a count page is opened.
const CountsPage = lazy(() => import('../features/counts/components/CountsPage').then((m) => ({ default: m.CountsPage })));
const CountPage = lazy(() => import('../features/counts/components/CountPage').then((m) => ({ default: m.CountPage })));
const CountReplayPage = lazy(() => import('../features/counts/components/CountReplayPage').then((m) => ({ default: m.CountReplayPage })));
const SensorDataPage = lazy(() => import('../features/sensors/components/SensorDataPage').then((m) => ({ default: m.SensorDataPage })));
const CountReportPage = lazy(() => import('../features/counts/components/CountReportPage').then((m) => ({ default: m.CountReportPage })));

function Lazy({ children }: { children: ReactNode }) {
  return <Suspense fallback={<Loading />}>{children}</Suspense>;
}

export const routes: RouteObject[] = [
  {
    errorElement: <RootError />,
    children: [
      {
        element: <PublicLayout />,
        children: [
          {
            errorElement: <RouteError />,
            children: [
              { path: 'sign-in', element: <SignInPage /> },
              { path: 'setup', element: <SetupPage /> },
              { path: 'invite/:token', element: <AcceptInvitationPage /> },
              { path: 'reset-password', element: <RequestPasswordResetPage /> },
              { path: 'reset-password/:token', element: <CompletePasswordResetPage /> },
            ],
          },
        ],
      },
      {
        element: <AppShell />,
        children: [
          {
            // Errors inside a page keep the shell (navigation, sign out) around the error message.
            errorElement: <RouteError />,
            children: [
              { index: true, element: <HomePage /> },
              { path: 'hazards', element: <HazardRegisterPage /> },
              { path: 'hazards/new', element: <NewHazardPage /> },
              { path: 'hazards/tools', element: <EngineeringChecksPage /> },
              { path: 'hazards/propellants', element: <PropellantLibraryPage /> },
              { path: 'hazards/propellants/:id', element: <PropellantPage /> },
              { path: 'hazards/propellants/:id/cautions', element: <PropellantCautionsPage /> },
              { path: 'hazards/matrices', element: <RiskMatricesPage /> },
              { path: 'hazards/matrices/new', element: <NewRiskMatrixPage /> },
              { path: 'hazards/matrices/:id', element: <RiskMatrixPage /> },
              { path: 'hazards/matrices/:id/edit', element: <EditRiskMatrixPage /> },
              { path: 'hazards/print', element: <HazardRegisterPrintPage /> },
              { path: 'hazards/print/:id', element: <HazardPrintPage /> },
              { path: 'hazards/:id', element: <HazardDetailPage /> },
              { path: 'procedures', element: <ProcedureListPage /> },
              { path: 'procedures/stations', element: <StationsPage /> },
              { path: 'procedures/:id', element: <ProcedurePage /> },
              { path: 'procedures/:id/crew', element: <CrewPage /> },
              { path: 'procedures/:id/diff', element: <DiffPage /> },
              { path: 'procedures/:id/revisions/:rev', element: <RevisionPage /> },
              { path: 'procedures/:id/revisions/:rev/edit', element: <DraftEditorPage /> },
              { path: 'procedures/:id/revisions/:rev/print', element: <ProcedurePrintPage /> },
              { path: 'counts', element: <Lazy><CountsPage /></Lazy> },
              { path: 'counts/:id', element: <Lazy><CountPage /></Lazy> },
              { path: 'counts/:id/report', element: <Lazy><CountReportPage /></Lazy> },
              { path: 'counts/:id/replay', element: <Lazy><CountReplayPage /></Lazy> },
              { path: 'anomalies', element: <AnomaliesPage /> },
              { path: 'anomalies/new', element: <NewAnomalyPage /> },
              { path: 'anomalies/:id', element: <AnomalyDetailPage /> },
              { path: 'counts/:id/data', element: <Lazy><SensorDataPage /></Lazy> },
              { path: 'records', element: <RecordsPage /> },
              { path: 'profile', element: <ProfilePage /> },
              {
                path: 'admin',
                element: <RequireRole anyOf={['admin']} />,
                children: [
                  { path: 'people', element: <PeoplePage /> },
                  { path: 'mail', element: <MailOutboxPage /> },
                ],
              },
            ],
          },
        ],
      },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];

export function createAppRouter() {
  return createBrowserRouter(routes);
}
