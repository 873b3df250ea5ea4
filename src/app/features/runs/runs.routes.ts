import { Routes } from '@angular/router';

import { roleGuard } from '../../core/auth/role-guard';
import { RUN_AUTHORS } from './run-detail.models';

export const runsRoutes: Routes = [
  {
    path: '',
    title: 'Runs | Qwell',
    loadComponent: () => import('./run-list/run-list').then((m) => m.RunList),
  },
  {
    path: 'new',
    title: 'New run | Qwell',
    canActivate: [roleGuard],
    data: { roles: RUN_AUTHORS },
    loadComponent: () => import('./run-entry/run-entry').then((m) => m.RunEntry),
  },
  {
    path: ':id/edit',
    title: 'Edit run | Qwell',
    canActivate: [roleGuard],
    data: { roles: RUN_AUTHORS },
    loadComponent: () => import('./run-entry/run-entry').then((m) => m.RunEntry),
  },
  {
    // Kept last: literal paths such as 'new' must match before this parameter does.
    path: ':id',
    title: 'Run | Qwell',
    loadComponent: () => import('./run-detail/run-detail').then((m) => m.RunDetail),
  },
];
