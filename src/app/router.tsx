import { lazy, Suspense, type ReactNode } from 'react';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { Loading } from '../components/ui/Page';
import { SignInPage } from '../features/auth/components/SignInPage';
import { HomePage } from '../features/home/components/HomePage';
import { AppShell } from './layout/AppShell';
import { PublicLayout } from './layout/PublicLayout';
import { NotFoundRoute } from './NotFound';
import { RequireRole } from './RequireRole';
import { RootError, RouteError } from './RouteError';

// Every feature's pages are loaded when one of them is first opened: a station's phone on a weak link at the stand
// loads the shell and the count screens, not the procedure editor or the hazard register. (The live count pulls in
// socket.io.)
const AcceptInvitationPage = lazy(() => import('../features/auth/components/AcceptInvitationPage').then((m) => ({ default: m.AcceptInvitationPage })));
const CompletePasswordResetPage = lazy(() => import('../features/auth/components/CompletePasswordResetPage').then((m) => ({ default: m.CompletePasswordResetPage })));
const RequestPasswordResetPage = lazy(() => import('../features/auth/components/RequestPasswordResetPage').then((m) => ({ default: m.RequestPasswordResetPage })));
const SetupPage = lazy(() => import('../features/auth/components/SetupPage').then((m) => ({ default: m.SetupPage })));
const AnomaliesPage = lazy(() => import('../features/anomalies/components/AnomaliesPage').then((m) => ({ default: m.AnomaliesPage })));
const AnomalyDetailPage = lazy(() => import('../features/anomalies/components/AnomalyDetailPage').then((m) => ({ default: m.AnomalyDetailPage })));
const NewAnomalyPage = lazy(() => import('../features/anomalies/components/NewAnomalyPage').then((m) => ({ default: m.NewAnomalyPage })));
const EngineeringChecksPage = lazy(() => import('../features/hazards/components/EngineeringChecksPage').then((m) => ({ default: m.EngineeringChecksPage })));
const HazardDetailPage = lazy(() => import('../features/hazards/components/HazardDetailPage').then((m) => ({ default: m.HazardDetailPage })));
const HazardPrintPage = lazy(() => import('../features/hazards/components/HazardPrintPage').then((m) => ({ default: m.HazardPrintPage })));
const HazardRegisterPrintPage = lazy(() => import('../features/hazards/components/HazardPrintPage').then((m) => ({ default: m.HazardRegisterPrintPage })));
const HazardRegisterPage = lazy(() => import('../features/hazards/components/HazardRegisterPage').then((m) => ({ default: m.HazardRegisterPage })));
const NewHazardPage = lazy(() => import('../features/hazards/components/NewHazardPage').then((m) => ({ default: m.NewHazardPage })));
const PropellantCautionsPage = lazy(() => import('../features/hazards/components/PropellantPages').then((m) => ({ default: m.PropellantCautionsPage })));
const PropellantLibraryPage = lazy(() => import('../features/hazards/components/PropellantPages').then((m) => ({ default: m.PropellantLibraryPage })));
const PropellantPage = lazy(() => import('../features/hazards/components/PropellantPages').then((m) => ({ default: m.PropellantPage })));
const EditRiskMatrixPage = lazy(() => import('../features/hazards/components/RiskMatrixEditPages').then((m) => ({ default: m.EditRiskMatrixPage })));
const NewRiskMatrixPage = lazy(() => import('../features/hazards/components/RiskMatrixEditPages').then((m) => ({ default: m.NewRiskMatrixPage })));
const RiskMatricesPage = lazy(() => import('../features/hazards/components/RiskMatrixPages').then((m) => ({ default: m.RiskMatricesPage })));
const RiskMatrixPage = lazy(() => import('../features/hazards/components/RiskMatrixPages').then((m) => ({ default: m.RiskMatrixPage })));
const MailOutboxPage = lazy(() => import('../features/mail/components/MailOutboxPage').then((m) => ({ default: m.MailOutboxPage })));
const PeoplePage = lazy(() => import('../features/people/components/PeoplePage').then((m) => ({ default: m.PeoplePage })));
const CrewPage = lazy(() => import('../features/procedures/components/CrewPage').then((m) => ({ default: m.CrewPage })));
const DiffPage = lazy(() => import('../features/procedures/components/DiffPage').then((m) => ({ default: m.DiffPage })));
const DraftEditorPage = lazy(() => import('../features/procedures/components/DraftEditorPage').then((m) => ({ default: m.DraftEditorPage })));
const ProcedureListPage = lazy(() => import('../features/procedures/components/ProcedureListPage').then((m) => ({ default: m.ProcedureListPage })));
const ProcedurePage = lazy(() => import('../features/procedures/components/ProcedurePage').then((m) => ({ default: m.ProcedurePage })));
const ProcedurePrintPage = lazy(() => import('../features/procedures/components/ProcedurePrintPage').then((m) => ({ default: m.ProcedurePrintPage })));
const RevisionPage = lazy(() => import('../features/procedures/components/RevisionPage').then((m) => ({ default: m.RevisionPage })));
const StationsPage = lazy(() => import('../features/procedures/components/StationsPage').then((m) => ({ default: m.StationsPage })));
const ProfilePage = lazy(() => import('../features/profile/components/ProfilePage').then((m) => ({ default: m.ProfilePage })));
const RecordsPage = lazy(() => import('../features/records/components/RecordsPage').then((m) => ({ default: m.RecordsPage })));
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
              { path: 'setup', element: <Lazy><SetupPage /></Lazy> },
              { path: 'invite/:token', element: <Lazy><AcceptInvitationPage /></Lazy> },
              { path: 'reset-password', element: <Lazy><RequestPasswordResetPage /></Lazy> },
              { path: 'reset-password/:token', element: <Lazy><CompletePasswordResetPage /></Lazy> },
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
              { path: 'hazards', element: <Lazy><HazardRegisterPage /></Lazy> },
              { path: 'hazards/new', element: <Lazy><NewHazardPage /></Lazy> },
              { path: 'hazards/tools', element: <Lazy><EngineeringChecksPage /></Lazy> },
              { path: 'hazards/propellants', element: <Lazy><PropellantLibraryPage /></Lazy> },
              { path: 'hazards/propellants/:id', element: <Lazy><PropellantPage /></Lazy> },
              { path: 'hazards/propellants/:id/cautions', element: <Lazy><PropellantCautionsPage /></Lazy> },
              { path: 'hazards/matrices', element: <Lazy><RiskMatricesPage /></Lazy> },
              { path: 'hazards/matrices/new', element: <Lazy><NewRiskMatrixPage /></Lazy> },
              { path: 'hazards/matrices/:id', element: <Lazy><RiskMatrixPage /></Lazy> },
              { path: 'hazards/matrices/:id/edit', element: <Lazy><EditRiskMatrixPage /></Lazy> },
              { path: 'hazards/print', element: <Lazy><HazardRegisterPrintPage /></Lazy> },
              { path: 'hazards/print/:id', element: <Lazy><HazardPrintPage /></Lazy> },
              { path: 'hazards/:id', element: <Lazy><HazardDetailPage /></Lazy> },
              { path: 'procedures', element: <Lazy><ProcedureListPage /></Lazy> },
              { path: 'procedures/stations', element: <Lazy><StationsPage /></Lazy> },
              { path: 'procedures/:id', element: <Lazy><ProcedurePage /></Lazy> },
              { path: 'procedures/:id/crew', element: <Lazy><CrewPage /></Lazy> },
              { path: 'procedures/:id/diff', element: <Lazy><DiffPage /></Lazy> },
              { path: 'procedures/:id/revisions/:rev', element: <Lazy><RevisionPage /></Lazy> },
              { path: 'procedures/:id/revisions/:rev/edit', element: <Lazy><DraftEditorPage /></Lazy> },
              { path: 'procedures/:id/revisions/:rev/print', element: <Lazy><ProcedurePrintPage /></Lazy> },
              { path: 'counts', element: <Lazy><CountsPage /></Lazy> },
              { path: 'counts/:id', element: <Lazy><CountPage /></Lazy> },
              { path: 'counts/:id/report', element: <Lazy><CountReportPage /></Lazy> },
              { path: 'counts/:id/replay', element: <Lazy><CountReplayPage /></Lazy> },
              { path: 'anomalies', element: <Lazy><AnomaliesPage /></Lazy> },
              { path: 'anomalies/new', element: <Lazy><NewAnomalyPage /></Lazy> },
              { path: 'anomalies/:id', element: <Lazy><AnomalyDetailPage /></Lazy> },
              { path: 'counts/:id/data', element: <Lazy><SensorDataPage /></Lazy> },
              { path: 'records', element: <Lazy><RecordsPage /></Lazy> },
              { path: 'profile', element: <Lazy><ProfilePage /></Lazy> },
              {
                path: 'admin',
                element: <RequireRole anyOf={['admin']} />,
                children: [
                  { path: 'people', element: <Lazy><PeoplePage /></Lazy> },
                  { path: 'mail', element: <Lazy><MailOutboxPage /></Lazy> },
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
