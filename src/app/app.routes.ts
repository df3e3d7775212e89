import type { Routes } from '@angular/router';
import { authGuard } from './auth/auth-guard';
import { guestGuard } from './auth/guest-guard';
import { roleGuard } from './auth/role-guard';

export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'projects' },

  // Signed-out pages
  {
    path: 'sign-in',
    title: 'Sign in · Tailroom',
    canActivate: [guestGuard],
    loadComponent: () => import('./auth/sign-in-page/sign-in-page').then((m) => m.SignInPage),
  },
  {
    path: 'create-account',
    title: 'Create account · Tailroom',
    canActivate: [guestGuard],
    loadComponent: () => import('./auth/create-account-page/create-account-page').then((m) => m.CreateAccountPage),
  },
  {
    path: 'forgot-password',
    title: 'Reset your password · Tailroom',
    canActivate: [guestGuard],
    loadComponent: () => import('./auth/forgot-password-page/forgot-password-page').then((m) => m.ForgotPasswordPage),
  },
  {
    path: 'reset-password/:token',
    title: 'Set a new password · Tailroom',
    loadComponent: () => import('./auth/reset-password-page/reset-password-page').then((m) => m.ResetPasswordPage),
  },
  {
    path: 'finish-sign-up/:token',
    title: 'Finish your account · Tailroom',
    loadComponent: () => import('./auth/finish-sign-up-page/finish-sign-up-page').then((m) => m.FinishSignUpPage),
  },
  {
    path: 'invitations/:token',
    title: 'Invitation · Tailroom',
    loadComponent: () => import('./orgs/invitation-page/invitation-page').then((m) => m.InvitationPage),
  },

  // Signed-in pages
  {
    path: 'projects',
    title: 'Projects · Tailroom',
    canActivate: [authGuard],
    loadComponent: () => import('./projects/project-list-page/project-list-page').then((m) => m.ProjectListPage),
  },
  {
    path: 'projects/:id',
    title: 'Project · Tailroom',
    canActivate: [authGuard],
    loadComponent: () => import('./projects/project-page/project-page').then((m) => m.ProjectPage),
  },
  {
    path: 'projects/:id/scenarios/:scenarioId',
    title: 'Trade-off · Tailroom',
    canActivate: [authGuard],
    loadComponent: () => import('./scenarios/tradeoff-page/tradeoff-page').then((m) => m.TradeoffPage),
  },
  {
    path: 'projects/:id/reports/:reportId',
    title: 'Client report · Tailroom',
    canActivate: [authGuard],
    loadComponent: () => import('./reports/report-page/report-page').then((m) => m.ReportPage),
  },
  {
    path: 'r/:token',
    title: 'Heating report',
    loadComponent: () => import('./reports/public-report-page/public-report-page').then((m) => m.PublicReportPage),
  },
  {
    path: 'projects/:id/compare',
    title: 'Compare scenarios · Tailroom',
    canActivate: [authGuard],
    loadComponent: () => import('./scenarios/compare-page/compare-page').then((m) => m.ComparePage),
  },
  {
    path: 'climate-sites',
    title: 'Climate sites · Tailroom',
    canActivate: [authGuard],
    loadComponent: () =>
      import('./climate/climate-site-list-page/climate-site-list-page').then((m) => m.ClimateSiteListPage),
  },
  {
    path: 'climate-sites/new',
    title: 'New climate site · Tailroom',
    canActivate: [roleGuard('project:write')],
    loadComponent: () =>
      import('./climate/climate-site-new-page/climate-site-new-page').then((m) => m.ClimateSiteNewPage),
  },
  {
    path: 'climate-sites/:id',
    title: 'Climate site · Tailroom',
    canActivate: [authGuard],
    loadComponent: () => import('./climate/climate-site-page/climate-site-page').then((m) => m.ClimateSitePage),
  },
  {
    path: 'equipment-lists',
    title: 'Equipment · Tailroom',
    canActivate: [authGuard],
    loadComponent: () =>
      import('./equipment/equipment-lists-page/equipment-lists-page').then((m) => m.EquipmentListsPage),
  },
  {
    path: 'equipment-lists/:id',
    title: 'Equipment list · Tailroom',
    canActivate: [authGuard],
    loadComponent: () => import('./equipment/equipment-list-page/equipment-list-page').then((m) => m.EquipmentListPage),
  },
  {
    path: 'billing',
    title: 'Plan & billing · Tailroom',
    canActivate: [roleGuard('billing:manage')],
    loadComponent: () => import('./billing/billing-page/billing-page').then((m) => m.BillingPage),
  },
  {
    path: 'team',
    title: 'Team · Tailroom',
    canActivate: [authGuard],
    loadComponent: () => import('./orgs/team-page/team-page').then((m) => m.TeamPage),
  },

  // Development only: the page itself says so when the server has no outbox.
  {
    path: 'dev/outbox',
    title: 'Dev outbox · Tailroom',
    loadComponent: () => import('./dev/outbox-page/outbox-page').then((m) => m.OutboxPage),
  },

  {
    path: 'forbidden',
    title: 'Not allowed · Tailroom',
    loadComponent: () => import('./core/forbidden-page/forbidden-page').then((m) => m.ForbiddenPage),
  },
  {
    path: '**',
    title: 'Page not found · Tailroom',
    loadComponent: () => import('./core/not-found-page/not-found-page').then((m) => m.NotFoundPage),
  },
];
