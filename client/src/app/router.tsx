import { Navigate, createBrowserRouter } from 'react-router-dom';
import { RootLayout } from './layout/RootLayout';
import { SignedInLayout } from './layout/SignedInLayout';
import { SignInPage } from './routes/sign-in';
import { InvitePage } from './routes/invite';
import { ForgotPasswordPage } from './routes/forgot-password';
import { ResetPasswordPage } from './routes/reset-password';
import { CheckPage } from './routes/check';
import { HomeRedirect } from './routes/home-redirect';
import { AccountPage } from './routes/account';
import { NotFoundPage } from './routes/not-found';
import { CoachHome } from './routes/coach';
import { CoachAthletePage } from './routes/staff/athlete-coach';
import { CoachExercisesPage } from './routes/coach/exercises';
import { CoachProgramPage } from './routes/coach/program';
import { CoachTeamProgramPage, CoachTeamVersionPage } from './routes/coach/team-program';
import { ClinicianLayout } from './routes/clinician/clinician-layout';
import { ClinicianHome } from './routes/clinician/caseload';
import { ClinicianAthletePage } from './routes/staff/athlete-clinician';
import { ClinicianCasePage } from './routes/clinician/case';
import { ClinicianAuditPage } from './routes/clinician/audit';
import { ADMIN_TEMPLATES_PATH, CLINICIAN_TEMPLATES_PATH, PlanTemplatePage, PlanTemplatesPage } from './routes/staff/plan-templates';
import { ClinicianExceptionsPage } from './routes/clinician/exceptions';
import { AthleteHome } from './routes/athlete';
import { GuardianHome } from './routes/guardian';
import { ReportPainPage } from './routes/athlete/report';
import { CheckInPage } from './routes/athlete/check-in';
import { LogSessionPage } from './routes/athlete/log';
import { MyWeekPage } from './routes/athlete/week';
import { StaffWorkloadPage } from './routes/staff/workload';
import { StaffFlagsPage } from './routes/staff/flags';
import { NoticesPage } from './routes/notices';
import { AdminLayout } from './routes/admin/admin-layout';
import { PeoplePage } from './routes/admin/people';
import { GroupPage, GroupsPage } from './routes/groups';
import { PersonPage } from './routes/admin/person';
import { InvitationsPage } from './routes/admin/invitations';
import { AuditPage } from './routes/admin/audit';
import { InjuryReportPage } from './routes/staff/injury-report';
import { OutboxPage } from './routes/admin/outbox';
import { OrganizationSettingsPage } from './routes/admin/settings';
import { ClipPage } from './routes/clip';
import { PainReportPage } from './routes/pain-report';
import { MyClipsPage, NewClipPage } from './routes/athlete/clips';
import { MyDocumentsPage } from './routes/athlete/documents';

export const routes = [
  {
    element: <RootLayout />,
    children: [
      { path: '/sign-in', element: <SignInPage /> },
      { path: '/invite', element: <InvitePage /> },
      { path: '/forgot-password', element: <ForgotPasswordPage /> },
      // The reset token rides in the fragment (#…), which never reaches the server.
      { path: '/reset', element: <ResetPasswordPage /> },
      // Public: a letter's holder checks its code without signing in.
      { path: '/check', element: <CheckPage /> },
      { path: '/check/:code', element: <CheckPage /> },
      {
        element: <SignedInLayout />,
        children: [
          { index: true, element: <HomeRedirect /> },
          {
            path: '/admin',
            element: <AdminLayout />,
            children: [
              { index: true, element: <Navigate to="/admin/people" replace /> },
              { path: 'people', element: <PeoplePage /> },
              { path: 'people/:personId', element: <PersonPage /> },
              { path: 'invitations', element: <InvitationsPage /> },
              { path: 'audit', element: <AuditPage /> },
              { path: 'injury-report', element: <InjuryReportPage /> },
              { path: 'plan-templates', element: <PlanTemplatesPage base={ADMIN_TEMPLATES_PATH} /> },
              { path: 'plan-templates/:templateId', element: <PlanTemplatePage base={ADMIN_TEMPLATES_PATH} /> },
              { path: 'outbox', element: <OutboxPage /> },
              { path: 'settings', element: <OrganizationSettingsPage /> },
            ],
          },
          { path: '/groups', element: <GroupsPage /> },
          { path: '/groups/:groupId', element: <GroupPage /> },
          { path: '/coach', element: <CoachHome /> },
          { path: '/coach/athletes/:athleteId', element: <CoachAthletePage /> },
          { path: '/coach/exercises', element: <CoachExercisesPage /> },
          { path: '/coach/programs/:programId', element: <CoachProgramPage /> },
          { path: '/coach/team-programs/:programId', element: <CoachTeamProgramPage /> },
          { path: '/coach/team-programs/:programId/sessions/:sessionId/athletes/:athleteId', element: <CoachTeamVersionPage /> },
          {
            path: '/clinician',
            element: <ClinicianLayout />,
            children: [
              { index: true, element: <ClinicianHome /> },
              { path: 'athletes/:athleteId', element: <ClinicianAthletePage /> },
              { path: 'cases/:caseId', element: <ClinicianCasePage /> },
              { path: 'exceptions', element: <ClinicianExceptionsPage /> },
              { path: 'audit', element: <ClinicianAuditPage /> },
              { path: 'injury-report', element: <InjuryReportPage /> },
              { path: 'plan-templates', element: <PlanTemplatesPage base={CLINICIAN_TEMPLATES_PATH} /> },
              { path: 'plan-templates/:templateId', element: <PlanTemplatePage base={CLINICIAN_TEMPLATES_PATH} /> },
            ],
          },
          { path: '/athlete', element: <AthleteHome /> },
          { path: '/athlete/report', element: <ReportPainPage /> },
          { path: '/athlete/check-in', element: <CheckInPage /> },
          { path: '/athlete/log', element: <LogSessionPage /> },
          { path: '/athlete/week', element: <MyWeekPage /> },
          { path: '/athlete/clips', element: <MyClipsPage /> },
          { path: '/athlete/clips/new', element: <NewClipPage /> },
          { path: '/athlete/documents', element: <MyDocumentsPage /> },
          // One clip page for everyone who may watch it; the server decides who that is.
          { path: '/clips/:clipId', element: <ClipPage /> },
          // One pain-report page for the athlete and their care team; the server decides the fields.
          { path: '/pain-reports/:reportId', element: <PainReportPage /> },
          { path: '/staff/athletes/:athleteId/workload', element: <StaffWorkloadPage /> },
          { path: '/staff/flags', element: <StaffFlagsPage /> },
          { path: '/notices', element: <NoticesPage /> },
          { path: '/guardian', element: <GuardianHome /> },
          { path: '/account', element: <AccountPage /> },
          { path: '*', element: <NotFoundPage /> },
        ],
      },
    ],
  },
];

export function createAppRouter() {
  return createBrowserRouter(routes);
}
