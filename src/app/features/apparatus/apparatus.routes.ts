import { Routes } from '@angular/router';

export const apparatusRoutes: Routes = [
  {
    path: '',
    title: 'Apparatus | Qwell',
    loadComponent: () => import('./apparatus-register/apparatus-register').then((m) => m.ApparatusRegister),
  },
  {
    path: ':id',
    title: 'Apparatus standardization | Qwell',
    loadComponent: () => import('./standardization/apparatus-standardization').then((m) => m.ApparatusStandardization),
  },
];
