import { lazy, type ReactNode } from 'react';
import { createBrowserRouter, Navigate, useLocation } from 'react-router-dom';
import { type Role, MILL_WRITERS } from '@crankjournal/shared-types';
// The shell (navigation, live channel) loads after sign-in, so the sign-in page stays small.
const Shell = lazy(() => import('./components/AppShell/Shell').then((m) => ({ default: m.Shell })));
import { ErrorBoundary } from './components/ErrorBoundary/ErrorBoundary';
import { useSession } from './features/auth/useSession';
import { CALCULATORS } from './features/calculators/calculators';

const SignInPage = lazy(() => import('./features/auth/pages/SignIn.page'));
const SetPasswordPage = lazy(() => import('./features/auth/pages/SetPassword.page'));
const TodayPage = lazy(() => import('./features/home/pages/Today.page'));
const UsersPage = lazy(() => import('./features/users/pages/Users.page'));
const AccountPage = lazy(() => import('./features/account/pages/Account.page'));
const NotFoundPage = lazy(() => import('./components/NotFound.page'));
const MillOverviewPage = lazy(() => import('./features/mill/pages/MillOverview.page'));
const MillEditPage = lazy(() => import('./features/mill/pages/MillEdit.page'));
const MillSchedulesPage = lazy(() => import('./features/mill/pages/Schedules.page'));
const MillScheduleDetailPage = lazy(() => import('./features/mill/pages/ScheduleDetail.page'));
const MillScheduleEditPage = lazy(() => import('./features/mill/pages/ScheduleEdit.page'));
const MillRollingRunsPage = lazy(() => import('./features/mill/pages/RollingRuns.page'));
const MillRunRollingPage = lazy(() => import('./features/mill/pages/RunRolling.page'));
const MillLotsPage = lazy(() => import('./features/mill/pages/Lots.page'));
const MillLotDetailPage = lazy(() => import('./features/mill/pages/LotDetail.page'));
const OutstandingPage = lazy(() => import('./features/payments/pages/Outstanding.page'));
const EnginesPage = lazy(() => import('./features/engines/pages/Engines.page'));
const EngineDetailPage = lazy(() => import('./features/engines/pages/EngineDetail.page'));
const EngineEditPage = lazy(() => import('./features/engines/pages/EngineEdit.page'));
const AlarmFiguresPage = lazy(() => import('./features/alarms/pages/AlarmFigures.page'));
const RunsPage = lazy(() => import('./features/runs/pages/Runs.page'));
const NewRunPage = lazy(() => import('./features/runs/pages/NewRun.page'));
const LoggersPage = lazy(() => import('./features/loggers/pages/Loggers.page'));
const SiteSettingsPage = lazy(() => import('./features/site/pages/SiteSettings.page'));
const LiveRunPage = lazy(() => import('./features/runs/live/LiveRun.page'));
const RoundEntryPage = lazy(() => import('./features/runs/live/RoundEntry.page'));
const RunChecklistsPage = lazy(() => import('./features/checklists/pages/RunChecklists.page'));
const ChecklistPage = lazy(() => import('./features/checklists/pages/Checklist.page'));
const ChecklistTemplatesPage = lazy(() => import('./features/checklists/pages/ChecklistTemplates.page'));
const ChecklistTemplatePage = lazy(() => import('./features/checklists/pages/ChecklistTemplate.page'));
const TemplateEditorPage = lazy(() => import('./features/checklists/pages/TemplateEditor.page'));
const QualificationsPage = lazy(() => import('./features/qualifications/pages/Qualifications.page'));
const RunCardsPage = lazy(() => import('./features/indicator-cards/pages/RunCards.page'));
const CalculatorsPage = lazy(() => import('./features/calculators/pages/Calculators.page'));
const MaintenanceOverviewPage = lazy(() => import('./features/maintenance/pages/MaintenanceOverview.page'));
const BearingsPage = lazy(() => import('./features/maintenance/pages/Bearings.page'));
const BearingHistoryPage = lazy(() => import('./features/maintenance/pages/BearingHistory.page'));
const PlanDetailPage = lazy(() => import('./features/maintenance/pages/PlanDetail.page'));
const PlanEditPage = lazy(() => import('./features/maintenance/pages/PlanEdit.page'));
const InspectionsPage = lazy(() => import('./features/maintenance/pages/Inspections.page'));
const InspectionPage = lazy(() => import('./features/maintenance/pages/Inspection.page'));
const NewInspectionPage = lazy(() => import('./features/maintenance/pages/NewInspection.page'));
const WorkRecordsPage = lazy(() => import('./features/maintenance/pages/WorkRecords.page'));
const WorkRecordPage = lazy(() => import('./features/maintenance/pages/WorkRecord.page'));
const NewWorkRecordPage = lazy(() => import('./features/maintenance/pages/NewWorkRecord.page'));
const LubricationPage = lazy(() => import('./features/lubrication/pages/Lubrication.page'));
const VisitPage = lazy(() => import('./features/visit/pages/Visit.page'));
const VisitorBoardsPage = lazy(() => import('./features/visit/pages/VisitorBoards.page'));
const VisitorBoardQrPage = lazy(() => import('./features/visit/pages/VisitorBoardQr.page'));
/** Who may write maintenance records (the server enforces the same). */
const MAINTENANCE_WRITERS: Role[] = ['maintenance_lead', 'chief_engineer'];

function RequireSession({ children }: { children: ReactNode }) {
  const session = useSession();
  const location = useLocation();
  if (!session) return <Navigate to="/sign-in" replace state={{ from: location.pathname + location.search }} />;
  return <>{children}</>;
}

/** A screen only some roles may open; the server enforces the same rule on its routes. */
export function RequireRole({ roles, children }: { roles: readonly Role[]; children: ReactNode }) {
  const session = useSession();
  if (!session || !roles.includes(session.user.role)) return <NotFoundPage />;
  return <>{children}</>;
}

export const routes = [
  { path: '/sign-in', element: <SignInPage /> },
  { path: '/set-password', element: <SetPasswordPage /> },
  // The public visitor board: no sign-in, outside the crew's shell.
  { path: '/visit/:slug', element: <VisitPage /> },
  {
    path: '/',
    element: (
      <RequireSession>
        <ErrorBoundary>
          <Shell />
        </ErrorBoundary>
      </RequireSession>
    ),
    children: [
      { index: true, element: <TodayPage /> },
      { path: 'account', element: <AccountPage /> },
      {
        path: 'admin/users',
        element: (
          <RequireRole roles={['administrator']}>
            <UsersPage />
          </RequireRole>
        ),
      },
      { path: 'runs/:id', element: <LiveRunPage /> },
      { path: 'runs/:id/round', element: <RoundEntryPage /> },
      { path: 'runs/:id/cards', element: <RunCardsPage /> },
      { path: 'calculators', element: <CalculatorsPage /> },
      { path: 'maintenance', element: <MaintenanceOverviewPage /> },
      { path: 'maintenance/due', element: <MaintenanceOverviewPage /> },
      { path: 'maintenance/bearings', element: <BearingsPage /> },
      { path: 'maintenance/bearings/:id', element: <BearingHistoryPage /> },
      {
        path: 'maintenance/plans/new',
        element: (
          <RequireRole roles={MAINTENANCE_WRITERS}>
            <PlanEditPage />
          </RequireRole>
        ),
      },
      { path: 'maintenance/plans/:id', element: <PlanDetailPage /> },
      {
        path: 'maintenance/plans/:id/edit',
        element: (
          <RequireRole roles={MAINTENANCE_WRITERS}>
            <PlanEditPage />
          </RequireRole>
        ),
      },
      { path: 'maintenance/inspections', element: <InspectionsPage /> },
      {
        path: 'maintenance/inspections/new',
        element: (
          <RequireRole roles={MAINTENANCE_WRITERS}>
            <NewInspectionPage />
          </RequireRole>
        ),
      },
      { path: 'maintenance/inspections/:id', element: <InspectionPage /> },
      { path: 'maintenance/work', element: <WorkRecordsPage /> },
      {
        path: 'maintenance/work/new',
        element: (
          <RequireRole roles={MAINTENANCE_WRITERS}>
            <NewWorkRecordPage />
          </RequireRole>
        ),
      },
      { path: 'maintenance/work/:id', element: <WorkRecordPage /> },
      { path: 'lubrication', element: <LubricationPage /> },
      ...CALCULATORS.map((c) => ({
        path: c.path.replace(/^\//, ''),
        element: (
          <RequireRole roles={c.roles}>
            <c.Page />
          </RequireRole>
        ),
      })),
      { path: 'runs/:id/checklists', element: <RunChecklistsPage /> },
      { path: 'runs/:id/checklists/:checklistId', element: <ChecklistPage /> },
      { path: 'checklists', element: <ChecklistTemplatesPage /> },
      {
        path: 'checklists/templates/new',
        element: (
          <RequireRole roles={['chief_engineer']}>
            <TemplateEditorPage />
          </RequireRole>
        ),
      },
      { path: 'checklists/templates/:id', element: <ChecklistTemplatePage /> },
      {
        path: 'checklists/templates/:id/edit',
        element: (
          <RequireRole roles={['chief_engineer']}>
            <TemplateEditorPage />
          </RequireRole>
        ),
      },
      { path: 'qualifications', element: <QualificationsPage /> },
      { path: 'engines', element: <EnginesPage /> },
      {
        path: 'engines/new',
        element: (
          <RequireRole roles={['chief_engineer']}>
            <EngineEditPage />
          </RequireRole>
        ),
      },
      { path: 'engines/:id', element: <EngineDetailPage /> },
      {
        path: 'alarm-figures',
        element: (
          <RequireRole roles={['chief_engineer', 'maintenance_lead']}>
            <AlarmFiguresPage />
          </RequireRole>
        ),
      },
      {
        path: 'engines/:id/edit',
        element: (
          <RequireRole roles={['chief_engineer']}>
            <EngineEditPage />
          </RequireRole>
        ),
      },
      { path: 'runs', element: <RunsPage /> },
      {
        path: 'runs/new',
        element: (
          <RequireRole roles={['chief_engineer', 'operator']}>
            <NewRunPage />
          </RequireRole>
        ),
      },
      {
        path: 'visitor-boards',
        element: (
          <RequireRole roles={['chief_engineer']}>
            <VisitorBoardsPage />
          </RequireRole>
        ),
      },
      {
        path: 'visitor-boards/:id/qr',
        element: (
          <RequireRole roles={['chief_engineer']}>
            <VisitorBoardQrPage />
          </RequireRole>
        ),
      },
      {
        path: 'admin/site',
        element: (
          <RequireRole roles={['administrator']}>
            <SiteSettingsPage />
          </RequireRole>
        ),
      },
      {
        path: 'admin/loggers',
        element: (
          <RequireRole roles={['administrator']}>
            <LoggersPage />
          </RequireRole>
        ),
      },
      { path: 'mill', element: <MillOverviewPage /> },
      {
        path: 'mill/mills/new',
        element: (
          <RequireRole roles={MILL_WRITERS}>
            <MillEditPage />
          </RequireRole>
        ),
      },
      {
        path: 'mill/mills/:id/edit',
        element: (
          <RequireRole roles={MILL_WRITERS}>
            <MillEditPage />
          </RequireRole>
        ),
      },
      { path: 'mill/schedules', element: <MillSchedulesPage /> },
      {
        path: 'mill/schedules/new',
        element: (
          <RequireRole roles={MILL_WRITERS}>
            <MillScheduleEditPage />
          </RequireRole>
        ),
      },
      { path: 'mill/schedules/:id', element: <MillScheduleDetailPage /> },
      {
        path: 'mill/schedules/:id/edit',
        element: (
          <RequireRole roles={MILL_WRITERS}>
            <MillScheduleEditPage />
          </RequireRole>
        ),
      },
      { path: 'mill/rolling', element: <MillRollingRunsPage /> },
      { path: 'mill/rolling/:runId', element: <MillRunRollingPage /> },
      { path: 'mill/lots', element: <MillLotsPage /> },
      { path: 'mill/lots/:id', element: <MillLotDetailPage /> },
      {
        path: 'payments/outstanding',
        element: (
          <RequireRole roles={['administrator']}>
            <OutstandingPage />
          </RequireRole>
        ),
      },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);
