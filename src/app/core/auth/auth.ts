import { HttpClient } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { Observable, catchError, finalize, map, of, shareReplay, tap, throwError } from 'rxjs';

import { toProblem } from '../http/problem-details';
import { Person, PersonResponse } from './auth.models';

/** Who is signed in. The session itself lives in an httpOnly cookie the client never reads. */
@Injectable({ providedIn: 'root' })
export class Auth {
  private readonly http = inject(HttpClient);

  /** undefined until `/api/auth/me` has answered once; null when nobody is signed in. */
  private readonly current = signal<Person | null | undefined>(undefined);
  private restoring: Observable<Person | null> | null = null;

  /** The signed-in person, or null. */
  readonly person = computed(() => this.current() ?? null);
  readonly signedIn = computed(() => this.person() !== null);
  readonly role = computed(() => this.person()?.role ?? null);

  /** Asks the server once who owns the session cookie; later calls reuse the answer. */
  restore(): Observable<Person | null> {
    const known = this.current();
    if (known !== undefined) {
      return of(known);
    }
    this.restoring ??= this.http.get<PersonResponse>('/api/auth/me').pipe(
      map((body) => body.person),
      // A 401 means signed out; any other failure also leaves nobody signed in, and sign-in will say why.
      catchError(() => of(null)),
      tap((person) => this.current.set(person)),
      finalize(() => (this.restoring = null)),
      shareReplay({ bufferSize: 1, refCount: false }),
    );
    return this.restoring;
  }

  /** Errors arrive as ProblemDetails, ready to show. */
  signIn(email: string, password: string): Observable<Person> {
    return this.http.post<PersonResponse>('/api/auth/sign-in', { email, password }).pipe(
      map((body) => body.person),
      tap((person) => this.current.set(person)),
      catchError((error: unknown) => throwError(() => toProblem(error))),
    );
  }

  signOut(): Observable<void> {
    return this.http.post<void>('/api/auth/sign-out', null).pipe(
      // Whatever the server says, this tab no longer holds a session.
      finalize(() => this.forget()),
      catchError(() => of(undefined)),
    );
  }

  /** Called when the server says the session is gone (expired, or signed out elsewhere). */
  forget(): void {
    this.current.set(null);
  }
}
