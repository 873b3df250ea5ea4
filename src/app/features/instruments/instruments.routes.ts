import { Routes } from '@angular/router';

export const instrumentsRoutes: Routes = [
  {
    path: '',
    title: 'Instruments | Qwell',
    loadComponent: () => import('./instrument-list/instrument-list').then((m) => m.InstrumentList),
  },
  {
    path: ':id',
    title: 'Instrument | Qwell',
    loadComponent: () =>
      import('./instrument-detail/instrument-detail').then((m) => m.InstrumentDetail),
  },
];
