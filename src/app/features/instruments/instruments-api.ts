import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { InstrumentList } from './instruments.models';

@Injectable({ providedIn: 'root' })
export class InstrumentsApi {
  private readonly http = inject(HttpClient);

  /** The whole register with each instrument's latest calibration. */
  list(): Observable<InstrumentList> {
    return this.http.get<InstrumentList>('/api/instruments');
  }
}
