import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { RunPage, RunQuery } from './runs.models';
import { CreateRunBody, ReadingsBody, RunChecklistResponse, RunVersion, UpdateRunBody } from './run-entry.models';
import { BalanceResponse, HistoryPage, ReviewAction, RunRecord, SignatureRequest } from './run-detail.models';

@Injectable({ providedIn: 'root' })
export class RunsApi {
  private readonly http = inject(HttpClient);

  /** One page of the runs this person may see; parts of the query not given take the server's defaults. */
  list(query: Partial<RunQuery>): Observable<RunPage> {
    // Filters that are not set are left out: the server reads a missing filter as "any".
    const set: Record<string, string | number> = {};
    for (const [key, value] of Object.entries(query) as [string, string | number | boolean | null | undefined][]) {
      if (value !== null && value !== undefined && value !== false) set[key] = value === true ? 'true' : value;
    }
    return this.http.get<RunPage>('/api/runs', { params: new HttpParams({ fromObject: set }) });
  }

  /** What a draft still lacks before submit, in the form's words (changes nothing). */
  checklist(id: number): Observable<RunChecklistResponse> {
    return this.http.get<RunChecklistResponse>(`/api/runs/${id}/checklist`);
  }

  /** Creates a draft; answers the new run with its id, code and version. */
  create(body: CreateRunBody): Observable<RunVersion> {
    return this.http.post<RunVersion>('/api/runs', body);
  }

  /** Edits a draft; 409 when `version` is no longer the run's. */
  update(id: number, body: UpdateRunBody): Observable<RunVersion> {
    return this.http.patch<RunVersion>(`/api/runs/${id}`, body);
  }

  /** Replaces all readings of a draft. */
  replaceReadings(id: number, body: ReadingsBody): Observable<RunVersion> {
    return this.http.put<RunVersion>(`/api/runs/${id}/readings`, body);
  }

  /** Hands the run in for its balance check; 400 lists what is missing. */
  submitDraft(id: number, version: number): Observable<RunVersion> {
    return this.http.post<RunVersion>(`/api/runs/${id}/submit`, { version });
  }

  /** The run with its setup, readings (SI), series, result summary, signatures and revisions. */
  get(id: number): Observable<RunRecord> {
    return this.http.get<RunRecord>(`/api/runs/${id}`);
  }

  /** The latest stored balance result; 404 while it is being checked or before submission. */
  balance(id: number): Observable<BalanceResponse> {
    return this.http.get<BalanceResponse>(`/api/runs/${id}/balance`);
  }

  /** Audit events of the run and its revisions, oldest first. */
  history(id: number): Observable<HistoryPage> {
    return this.http.get<HistoryPage>(`/api/runs/${id}/history`);
  }

  /** Address of the run document download. */
  documentUrl(id: number): string {
    return `/api/runs/${id}/document`;
  }

  /** Address of the printable run report (PDF). */
  reportUrl(id: number): string {
    return `/api/runs/${id}/report.pdf`;
  }

  /** Signs a review decision: approve, return for correction or reject. */
  review(id: number, action: ReviewAction, body: SignatureRequest): Observable<unknown> {
    return this.http.post<unknown>(`/api/runs/${id}/${action}`, body);
  }

  /** Opens a correction of an approved run as a new draft revision. */
  revise(id: number, reason: string): Observable<{ id: number; revision: number }> {
    return this.http.post<{ id: number; revision: number }>(`/api/runs/${id}/revisions`, { reason });
  }
}
