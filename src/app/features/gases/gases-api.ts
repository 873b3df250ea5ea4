import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { GasListBody } from './gases.models';

@Injectable({ providedIn: 'root' })
export class GasesApi {
  private readonly http = inject(HttpClient);

  /** The gases the engine knows, by code. */
  list(): Observable<GasListBody> {
    return this.http.get<GasListBody>('/api/gases');
  }
}
