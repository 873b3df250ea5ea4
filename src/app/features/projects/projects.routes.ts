import { Routes } from '@angular/router';

export const projectsRoutes: Routes = [
  {
    path: '',
    title: 'Projects | Qwell',
    loadComponent: () => import('./project-list/project-list').then((m) => m.ProjectList),
  },
];
