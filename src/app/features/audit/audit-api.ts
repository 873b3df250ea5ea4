import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';

import { AuditActor, AuditFilters, AuditPage, AuditQuery, ChainCheck, ExportFormat } from './audit.models';

/** Only the filters that are set, as strings; the server treats a missing filter as "any". */
export function auditFilterParams(filters: AuditFilters): Record<string, string> {
  const params: Record<string, string> = {};
  for (const key of ['run', 'person', 'action', 'entityType', 'from', 'to'] as const) {
    const value = filters[key];
    if (value !== null && value !== '') {
      params[key] = String(value);
    }
  }
  if (filters.hideSignIns) {
    params['signIns'] = 'hide';
  }
  return params;
}

@Injectable({ providedIn: 'root' })
export class AuditApi {
  private readonly http = inject(HttpClient);

  /** One page of the trail, newest first. */
  list(query: AuditQuery): Observable<AuditPage> {
    const params = new HttpParams({
      fromObject: { ...auditFilterParams(query), page: query.page, pageSize: query.pageSize },
    });
    return this.http.get<AuditPage>('/api/audit', { params });
  }

  /** The people who appear in the trail. */
  actors(): Observable<AuditActor[]> {
    return this.http.get<{ items: AuditActor[] }>('/api/audit/actors').pipe(map((r) => r.items));
  }

  /** Walks the whole hash chain on the server. */
  verify(): Observable<ChainCheck> {
    return this.http.get<ChainCheck>('/api/audit/verify');
  }

  /** Address of a download of every event the filters select (a plain link: the browser saves it). */
  exportUrl(format: ExportFormat, filters: AuditFilters): string {
    const params = new HttpParams({ fromObject: { format, ...auditFilterParams(filters) } });
    return `/api/audit/export?${params.toString()}`;
  }
}
