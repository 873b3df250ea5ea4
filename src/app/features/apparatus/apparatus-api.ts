import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { Apparatus, ApparatusBody, ApparatusList } from './apparatus.models';

@Injectable({ providedIn: 'root' })
export class ApparatusApi {
  private readonly http = inject(HttpClient);

  /** Every piece of apparatus, by tag. */
  list(): Observable<ApparatusList> {
    return this.http.get<ApparatusList>('/api/apparatus');
  }

  /** Adds a piece of apparatus (quality officers). */
  create(body: ApparatusBody): Observable<Apparatus> {
    return this.http.post<Apparatus>('/api/apparatus', body);
  }

  /** Replaces a piece of apparatus's record (quality officers). */
  update(id: number, body: ApparatusBody): Observable<Apparatus> {
    return this.http.put<Apparatus>(`/api/apparatus/${id}`, body);
  }
}
