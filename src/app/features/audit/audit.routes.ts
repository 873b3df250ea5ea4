import { Routes } from '@angular/router';

export const auditRoutes: Routes = [
  {
    path: '',
    title: 'Audit trail | Qwell',
    loadComponent: () => import('./audit-trail/audit-trail').then((m) => m.AuditTrail),
  },
];
