import { Routes } from '@angular/router';

export const instrumentsRoutes: Routes = [
  {
    path: '',
    title: 'Instruments | Qwell',
    loadComponent: () => import('./instrument-list/instrument-list').then((m) => m.InstrumentList),
  },
];
