import { Routes } from '@angular/router';
import { permissionGuard, signedInGuard, signedOutGuard } from './core/guards';

export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'projects' },
  {
    path: 'sign-in',
    title: 'Sign in · Runnel',
    canActivate: [signedOutGuard],
    loadComponent: () => import('./screens/sign-in/sign-in-screen').then((m) => m.SignInScreen),
  },
  {
    // The mailed link: open to anyone, also when signed in (the screen asks before replacing that sign-in).
    path: 'sign-up/confirm',
    title: 'Finish creating your account · Runnel',
    loadComponent: () => import('./screens/sign-up/sign-up-confirm-screen').then((m) => m.SignUpConfirmScreen),
  },
  {
    path: 'sign-up',
    title: 'Create an account · Runnel',
    canActivate: [signedOutGuard],
    loadComponent: () => import('./screens/sign-up/sign-up-screen').then((m) => m.SignUpScreen),
  },
  {
    path: 'join/:token',
    title: 'Join a team · Runnel',
    loadComponent: () => import('./screens/join/join-screen').then((m) => m.JoinScreen),
  },
  {
    path: 'projects',
    title: 'Projects · Runnel',
    canActivate: [signedInGuard],
    loadComponent: () => import('./screens/projects/projects-screen').then((m) => m.ProjectsScreen),
  },
  {
    path: 'projects/:projectId',
    canActivate: [signedInGuard],
    loadComponent: () => import('./screens/project-shell/project-shell').then((m) => m.ProjectShell),
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'layout' },
      {
        path: 'layout',
        title: 'Layout · Runnel',
        loadComponent: () => import('./screens/layout/layout-screen').then((m) => m.LayoutScreen),
      },
      {
        path: 'walk',
        title: 'Walk · Runnel',
        loadComponent: () => import('./screens/walk/walk-screen').then((m) => m.WalkScreen),
      },
      {
        path: 'budget',
        title: 'Water budget · Runnel',
        loadComponent: () => import('./screens/budget/budget-screen').then((m) => m.BudgetScreen),
      },
      {
        path: 'profile',
        title: 'Profile · Runnel',
        loadComponent: () => import('./screens/profile/profile-screen').then((m) => m.ProfileScreen),
      },
      {
        path: 'timeline',
        title: 'Timeline · Runnel',
        loadComponent: () => import('./screens/timeline/timeline-screen').then((m) => m.TimelineScreen),
      },
      {
        path: 'review',
        title: 'Review · Runnel',
        loadComponent: () => import('./screens/review/review-screen').then((m) => m.ReviewScreen),
      },
      {
        path: 'options',
        title: 'Options · Runnel',
        loadComponent: () => import('./screens/options/options-screen').then((m) => m.OptionsScreen),
      },
      {
        path: 'takeoff',
        title: 'Takeoff · Runnel',
        loadComponent: () => import('./screens/takeoff/takeoff-screen').then((m) => m.TakeoffScreen),
      },
      { path: 'files', title: 'Files · Runnel', loadComponent: () => import('./screens/files/files-screen').then((m) => m.FilesScreen) },
    ],
  },
  {
    path: 'team',
    title: 'Team · Runnel',
    canActivate: [signedInGuard, permissionGuard('team.manage')],
    loadComponent: () => import('./screens/team/team-screen').then((m) => m.TeamScreen),
  },
  {
    path: 'outbox',
    title: 'Outbox · Runnel',
    canActivate: [signedInGuard, permissionGuard('outbox.read')],
    loadComponent: () => import('./screens/outbox/outbox-screen').then((m) => m.OutboxScreen),
  },
  {
    path: 'audit',
    title: 'Audit log · Runnel',
    canActivate: [signedInGuard, permissionGuard('audit.read')],
    loadComponent: () => import('./screens/audit/audit-screen').then((m) => m.AuditScreen),
  },
  { path: '**', redirectTo: 'projects' },
];
