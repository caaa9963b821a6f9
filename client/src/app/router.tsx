import type { ComponentType } from 'react';
import { Navigate, createBrowserRouter, type RouteObject } from 'react-router-dom';
import { RootLayout, StartingUp } from './layout/RootLayout';
// Small, and it only picks where to go: loading it lazily would put a round trip before every home.
import { HomeRedirect } from './routes/home-redirect';

/**
 * Every screen but the outer frame is loaded when first visited (a fast first load on a slow phone): the
 * sign-in page and each role's home fetch only their own code, and the heavy parts (charts, the clip player,
 * the plan editor, the program builder) come with the screens that use them. The router loads a route's code
 * before it renders it, so a navigation keeps the current screen until the next is ready.
 */
function page<M extends Record<string, unknown>>(load: () => Promise<M>, name: keyof M & string): RouteObject['lazy'] {
  return async () => ({ Component: (await load())[name] as ComponentType });
}

/** The plan templates' pages, the same for clinicians and admins under their own base path. */
function templatesPage(who: 'admin' | 'clinician', which: 'list' | 'one'): RouteObject['lazy'] {
  return async () => {
    const m = await import('./routes/staff/plan-templates');
    const base = who === 'admin' ? m.ADMIN_TEMPLATES_PATH : m.CLINICIAN_TEMPLATES_PATH;
    const Page = which === 'list' ? m.PlanTemplatesPage : m.PlanTemplatePage;
    return { Component: () => <Page base={base} /> };
  };
}

export const routes: RouteObject[] = [
  {
    element: <RootLayout />,
    // Shown only while the first screen's code loads.
    hydrateFallbackElement: <StartingUp />,
    children: [
      { path: '/sign-in', lazy: page(() => import('./routes/sign-in'), 'SignInPage') },
      { path: '/invite', lazy: page(() => import('./routes/invite'), 'InvitePage') },
      { path: '/forgot-password', lazy: page(() => import('./routes/forgot-password'), 'ForgotPasswordPage') },
      // The reset token rides in the fragment (#…), which never reaches the server.
      { path: '/reset', lazy: page(() => import('./routes/reset-password'), 'ResetPasswordPage') },
      { path: '/start', lazy: page(() => import('./routes/start-organization'), 'StartOrganizationPage') },
      // The confirmation token rides in the fragment too.
      { path: '/start/confirm', lazy: page(() => import('./routes/start-organization'), 'ConfirmOrganizationPage') },
      // Public: a letter's holder checks its code without signing in.
      { path: '/check', lazy: page(() => import('./routes/check'), 'CheckPage') },
      { path: '/check/:code', lazy: page(() => import('./routes/check'), 'CheckPage') },
      // An e-mailed record link: the code in the fragment; signed out, it offers sign-in and comes back.
      { path: '/record-download', lazy: page(() => import('./routes/record-download'), 'RecordDownloadPage') },
      {
        lazy: page(() => import('./layout/SignedInLayout'), 'SignedInLayout'),
        children: [
          { index: true, element: <HomeRedirect /> },
          {
            path: '/admin',
            lazy: page(() => import('./routes/admin/admin-layout'), 'AdminLayout'),
            children: [
              { index: true, element: <Navigate to="/admin/people" replace /> },
              { path: 'people', lazy: page(() => import('./routes/admin/people'), 'PeoplePage') },
              { path: 'people/:personId', lazy: page(() => import('./routes/admin/person'), 'PersonPage') },
              { path: 'invitations', lazy: page(() => import('./routes/admin/invitations'), 'InvitationsPage') },
              { path: 'roster-import', lazy: page(() => import('./routes/admin/roster-import'), 'RosterImportPage') },
              { path: 'audit', lazy: page(() => import('./routes/admin/audit'), 'AuditPage') },
              { path: 'injury-report', lazy: page(() => import('./routes/staff/injury-report'), 'InjuryReportPage') },
              { path: 'outbox', lazy: page(() => import('./routes/admin/outbox'), 'OutboxPage') },
              { path: 'settings', lazy: page(() => import('./routes/admin/settings'), 'OrganizationSettingsPage') },
              { path: 'plan-templates', lazy: templatesPage('admin', 'list') },
              { path: 'plan-templates/:templateId', lazy: templatesPage('admin', 'one') },
            ],
          },
          { path: '/groups', lazy: page(() => import('./routes/groups'), 'GroupsPage') },
          { path: '/groups/:groupId', lazy: page(() => import('./routes/groups'), 'GroupPage') },
          { path: '/coach', lazy: page(() => import('./routes/coach'), 'CoachHome') },
          { path: '/coach/athletes/:athleteId', lazy: page(() => import('./routes/staff/athlete-coach'), 'CoachAthletePage') },
          { path: '/coach/exercises', lazy: page(() => import('./routes/coach/exercises'), 'CoachExercisesPage') },
          { path: '/coach/programs/:programId', lazy: page(() => import('./routes/coach/program'), 'CoachProgramPage') },
          { path: '/coach/team-programs/:programId', lazy: page(() => import('./routes/coach/team-program'), 'CoachTeamProgramPage') },
          {
            path: '/coach/team-programs/:programId/sessions/:sessionId/athletes/:athleteId',
            lazy: page(() => import('./routes/coach/team-program'), 'CoachTeamVersionPage'),
          },
          {
            path: '/clinician',
            lazy: page(() => import('./routes/clinician/clinician-layout'), 'ClinicianLayout'),
            children: [
              { index: true, lazy: page(() => import('./routes/clinician/caseload'), 'ClinicianHome') },
              { path: 'athletes/:athleteId', lazy: page(() => import('./routes/staff/athlete-clinician'), 'ClinicianAthletePage') },
              { path: 'cases/:caseId', lazy: page(() => import('./routes/clinician/case'), 'ClinicianCasePage') },
              { path: 'exceptions', lazy: page(() => import('./routes/clinician/exceptions'), 'ClinicianExceptionsPage') },
              { path: 'audit', lazy: page(() => import('./routes/clinician/audit'), 'ClinicianAuditPage') },
              { path: 'injury-report', lazy: page(() => import('./routes/staff/injury-report'), 'InjuryReportPage') },
              { path: 'plan-templates', lazy: templatesPage('clinician', 'list') },
              { path: 'plan-templates/:templateId', lazy: templatesPage('clinician', 'one') },
            ],
          },
          { path: '/athlete', lazy: page(() => import('./routes/athlete'), 'AthleteHome') },
          { path: '/athlete/report', lazy: page(() => import('./routes/athlete/report'), 'ReportPainPage') },
          { path: '/athlete/check-in', lazy: page(() => import('./routes/athlete/check-in'), 'CheckInPage') },
          { path: '/athlete/log', lazy: page(() => import('./routes/athlete/log'), 'LogSessionPage') },
          { path: '/athlete/week', lazy: page(() => import('./routes/athlete/week'), 'MyWeekPage') },
          { path: '/athlete/clips', lazy: page(() => import('./routes/athlete/clips'), 'MyClipsPage') },
          { path: '/athlete/clips/new', lazy: page(() => import('./routes/athlete/clips'), 'NewClipPage') },
          { path: '/athlete/documents', lazy: page(() => import('./routes/athlete/documents'), 'MyDocumentsPage') },
          // One clip page for everyone who may watch it; the server decides who that is.
          { path: '/clips/:clipId', lazy: page(() => import('./routes/clip'), 'ClipPage') },
          // One pain-report page for the athlete and their care team; the server decides the fields.
          { path: '/pain-reports/:reportId', lazy: page(() => import('./routes/pain-report'), 'PainReportPage') },
          { path: '/staff/athletes/:athleteId/workload', lazy: page(() => import('./routes/staff/workload'), 'StaffWorkloadPage') },
          { path: '/staff/flags', lazy: page(() => import('./routes/staff/flags'), 'StaffFlagsPage') },
          { path: '/notices', lazy: page(() => import('./routes/notices'), 'NoticesPage') },
          { path: '/guardian', lazy: page(() => import('./routes/guardian'), 'GuardianHome') },
          { path: '/account', lazy: page(() => import('./routes/account'), 'AccountPage') },
          { path: '*', lazy: page(() => import('./routes/not-found'), 'NotFoundPage') },
        ],
      },
    ],
  },
];

export function createAppRouter() {
  return createBrowserRouter(routes);
}
