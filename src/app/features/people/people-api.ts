import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { PeopleList } from './people.models';

@Injectable({ providedIn: 'root' })
export class PeopleApi {
  private readonly http = inject(HttpClient);

  /** Everyone with an account in this lab. */
  list(): Observable<PeopleList> {
    return this.http.get<PeopleList>('/api/people');
  }
}
