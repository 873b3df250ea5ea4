import { HttpClient, HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';

import {
  ColumnMap,
  CommitResult,
  CommitTarget,
  ImportMapping,
  ImportPreview,
  RowCheck,
  UploadOptions,
} from './imports.models';

@Injectable({ providedIn: 'root' })
export class ImportsApi {
  private readonly http = inject(HttpClient);

  /** Uploads a logger file; the events carry upload progress, the last one the preview. */
  upload(file: File, options: UploadOptions): Observable<HttpEvent<ImportPreview>> {
    const form = new FormData();
    form.append('file', file, file.name);
    if (options.delimiter) form.append('delimiter', options.delimiter);
    if (options.decimal) form.append('decimal', options.decimal);
    if (options.sheet.trim()) form.append('sheet', options.sheet.trim());
    return this.http.post<ImportPreview>('/api/imports', form, { reportProgress: true, observe: 'events' });
  }

  /** Checks every row against a mapping; stores nothing. */
  check(importId: number, mapping: ImportMapping): Observable<RowCheck> {
    return this.http.post<RowCheck>(`/api/imports/${importId}/check`, { mapping });
  }

  commit(importId: number, mapping: ImportMapping, target: CommitTarget): Observable<CommitResult> {
    return this.http.post<CommitResult>(`/api/imports/${importId}/commit`, { mapping, target });
  }

  columnMaps(): Observable<ColumnMap[]> {
    return this.http.get<{ items: ColumnMap[] }>('/api/imports/column-maps').pipe(map((r) => r.items));
  }

  saveColumnMap(name: string, headers: string[], mapping: ImportMapping): Observable<ColumnMap> {
    return this.http.post<ColumnMap>('/api/imports/column-maps', { name, headers, mapping });
  }
}
