import { Routes } from '@angular/router';

import { authGuard, signedOutGuard } from './core/auth/auth-guard';
import { roleGuard } from './core/auth/role-guard';
import { NAVIGATION } from './core/layout/navigation';

export const routes: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in | Qwell',
    canActivate: [signedOutGuard],
    loadComponent: () => import('./features/sign-in/sign-in').then((m) => m.SignIn),
  },
  {
    // Everything but sign-in sits in the shell and needs a session.
    path: '',
    canActivate: [authGuard],
    loadComponent: () => import('./core/layout/shell').then((m) => m.Shell),
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'home' },
      {
        path: 'home',
        loadChildren: () => import('./features/home/home.routes').then((m) => m.homeRoutes),
      },
      {
        path: 'runs',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.runs.roles },
        loadChildren: () => import('./features/runs/runs.routes').then((m) => m.runsRoutes),
      },
      {
        path: 'imports',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.imports.roles },
        loadChildren: () => import('./features/imports/imports.routes').then((m) => m.importsRoutes),
      },
      {
        path: 'instruments',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.instruments.roles },
        loadChildren: () =>
          import('./features/instruments/instruments.routes').then((m) => m.instrumentsRoutes),
      },
      {
        path: 'apparatus',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.apparatus.roles },
        loadChildren: () =>
          import('./features/apparatus/apparatus.routes').then((m) => m.apparatusRoutes),
      },
      {
        path: 'gases',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.gases.roles },
        loadChildren: () => import('./features/gases/gases.routes').then((m) => m.gasesRoutes),
      },
      {
        path: 'audit',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.audit.roles },
        loadChildren: () => import('./features/audit/audit.routes').then((m) => m.auditRoutes),
      },
      {
        path: 'people',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.people.roles },
        loadChildren: () => import('./features/people/people.routes').then((m) => m.peopleRoutes),
      },
      {
        path: 'projects',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.projects.roles },
        loadChildren: () =>
          import('./features/projects/projects.routes').then((m) => m.projectsRoutes),
      },
      {
        // Reached through roleGuard with skipLocationChange, so the address stays the one asked for.
        path: 'forbidden',
        title: 'Not for your role | Qwell',
        loadComponent: () => import('./core/pages/forbidden').then((m) => m.Forbidden),
      },
      {
        path: '**',
        title: 'Page not found | Qwell',
        loadComponent: () => import('./core/pages/not-found').then((m) => m.NotFound),
      },
    ],
  },
];
