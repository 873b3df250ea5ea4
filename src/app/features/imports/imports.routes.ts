import { Routes } from '@angular/router';

export const importsRoutes: Routes = [
  {
    path: '',
    title: 'Import a logger file | Qwell',
    loadComponent: () => import('./import-page/import-page').then((m) => m.ImportPage),
  },
];
