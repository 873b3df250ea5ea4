import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { RunPage, RunQuery } from './runs.models';

@Injectable({ providedIn: 'root' })
export class RunsApi {
  private readonly http = inject(HttpClient);

  /** One page of the runs this person may see. */
  list(query: RunQuery): Observable<RunPage> {
    const params = new HttpParams({
      fromObject: {
        page: query.page,
        pageSize: query.pageSize,
        state: query.state ?? '',
        sort: query.sort,
        dir: query.dir,
      },
    });
    return this.http.get<RunPage>('/api/runs', { params });
  }
}
