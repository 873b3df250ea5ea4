import { Routes } from '@angular/router';

export const peopleRoutes: Routes = [
  {
    path: '',
    title: 'People | Qwell',
    loadComponent: () => import('./people-list/people-list').then((m) => m.PeopleList),
  },
];
