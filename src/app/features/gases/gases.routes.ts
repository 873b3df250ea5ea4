import { Routes } from '@angular/router';

export const gasesRoutes: Routes = [
  {
    path: '',
    title: 'Gases | Qwell',
    loadComponent: () => import('./gas-list/gas-list').then((m) => m.GasList),
  },
];
