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
        path: 'instruments',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.instruments.roles },
        loadChildren: () =>
          import('./features/instruments/instruments.routes').then((m) => m.instrumentsRoutes),
      },
      {
        path: 'people',
        canActivate: [roleGuard],
        data: { roles: NAVIGATION.people.roles },
        loadChildren: () => import('./features/people/people.routes').then((m) => m.peopleRoutes),
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
