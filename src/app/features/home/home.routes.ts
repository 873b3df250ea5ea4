import { Routes } from '@angular/router';

export const homeRoutes: Routes = [
  {
    path: '',
    title: 'Home | Qwell',
    loadComponent: () => import('./home').then((m) => m.Home),
  },
];
