import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { HomeSummary } from './home.models';

@Injectable({ providedIn: 'root' })
export class HomeApi {
  private readonly http = inject(HttpClient);

  /** The signed-in person's queues with counts. */
  summary(): Observable<HomeSummary> {
    return this.http.get<HomeSummary>('/api/home');
  }
}
