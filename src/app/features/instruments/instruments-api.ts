import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import {
  CalibrationRecord,
  Instrument,
  InstrumentDetail,
  InstrumentList,
  NewCalibration,
  NewInstrument,
} from './instruments.models';

@Injectable({ providedIn: 'root' })
export class InstrumentsApi {
  private readonly http = inject(HttpClient);

  /** The whole register with each instrument's latest calibration. */
  list(): Observable<InstrumentList> {
    return this.http.get<InstrumentList>('/api/instruments');
  }

  /** One instrument with its calibration history. */
  get(id: number): Observable<InstrumentDetail> {
    return this.http.get<InstrumentDetail>(`/api/instruments/${id}`);
  }

  /** Registers an instrument (quality officers). */
  create(body: NewInstrument): Observable<Instrument> {
    return this.http.post<Instrument>('/api/instruments', body);
  }

  /** Adds a calibration certificate to an instrument (quality officers). */
  addCalibration(id: number, body: NewCalibration): Observable<CalibrationRecord> {
    return this.http.post<CalibrationRecord>(`/api/instruments/${id}/calibrations`, body);
  }
}
