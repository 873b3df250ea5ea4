import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { NewPerson, PeopleList, PersonChange, PersonRecord } from './people.models';

@Injectable({ providedIn: 'root' })
export class PeopleApi {
  private readonly http = inject(HttpClient);

  /** Everyone with an account in this lab. */
  list(): Observable<PeopleList> {
    return this.http.get<PeopleList>('/api/people');
  }

  /** Makes an account. */
  create(body: NewPerson): Observable<PersonRecord> {
    return this.http.post<PersonRecord>('/api/people', body);
  }

  /** Changes name, role, active state, lock or password. */
  update(id: number, change: PersonChange): Observable<PersonRecord> {
    return this.http.patch<PersonRecord>(`/api/people/${id}`, change);
  }
}
