import { Routes } from '@angular/router';

export const runsRoutes: Routes = [
  {
    path: '',
    title: 'Runs | Qwell',
    loadComponent: () => import('./run-list/run-list').then((m) => m.RunList),
  },
];
