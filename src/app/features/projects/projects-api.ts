import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';

import { NewProject, Project, ProjectListBody } from './projects.models';

@Injectable({ providedIn: 'root' })
export class ProjectsApi {
  private readonly http = inject(HttpClient);

  /** Projects with their members (administrators see all). */
  list(): Observable<ProjectListBody> {
    return this.http.get<ProjectListBody>('/api/projects');
  }

  /** Starts a project with no members (administrators). */
  create(body: NewProject): Observable<Omit<Project, 'members'>> {
    return this.http.post<Omit<Project, 'members'>>('/api/projects', body);
  }

  /** Replaces a project's members with exactly these people (administrators). */
  setMembers(id: number, personIds: number[]): Observable<{ id: number; members: number[] }> {
    return this.http.put<{ id: number; members: number[] }>(`/api/projects/${id}/members`, { personIds });
  }
}
