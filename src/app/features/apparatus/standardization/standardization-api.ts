import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { ApparatusChange, DueApparatus, Standardization, StandardizationOverview } from './standardization.models';

@Injectable({ providedIn: 'root' })
export class StandardizationApi {
  private readonly http = inject(HttpClient);

  /** The apparatus's standardization series, chart, current standardization and history. */
  overview(id: number): Observable<StandardizationOverview> {
    return this.http.get<StandardizationOverview>(`/api/apparatus/${id}/standardizations`);
  }

  /** Signs a standardization from the chosen runs (quality officers). */
  approve(id: number, body: { runIds: number[]; password: string; meaning: string; reason?: string }): Observable<Standardization> {
    return this.http.post<Standardization>(`/api/apparatus/${id}/standardizations`, body);
  }

  /** Records a change to the apparatus, which makes a new standardization due (quality officers). */
  recordChange(id: number, body: { description: string; changedOn?: string }): Observable<ApparatusChange> {
    return this.http.post<ApparatusChange>(`/api/apparatus/${id}/changes`, body);
  }

  /** Apparatus whose standardization is due. */
  due(): Observable<{ items: DueApparatus[] }> {
    return this.http.get<{ items: DueApparatus[] }>('/api/apparatus-due');
  }
}
