import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';

import { ProblemDetails } from '../http/problem-details';
import { Auth } from './auth';
import { Person } from './auth.models';

const dana: Person = { id: 3, email: 'investigator@lab.test', name: 'Dana Ortiz', role: 'investigator' };

describe('Auth', () => {
  let auth: Auth;
  let httpTesting: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    auth = TestBed.inject(Auth);
    httpTesting = TestBed.inject(HttpTestingController);
  });

  afterEach(() => httpTesting.verify());

  it('fills the person signal from GET /api/auth/me, asking only once', () => {
    const seen: (Person | null)[] = [];
    auth.restore().subscribe((person) => seen.push(person));
    auth.restore().subscribe((person) => seen.push(person));

    httpTesting.expectOne({ method: 'GET', url: '/api/auth/me' }).flush({ person: dana });

    expect(seen).toEqual([dana, dana]);
    expect(auth.person()).toEqual(dana);
    expect(auth.role()).toBe('investigator');
    auth.restore().subscribe((person) => expect(person).toEqual(dana));
    httpTesting.expectNone('/api/auth/me');
  });

  it('treats a 401 from me as signed out', () => {
    let result: Person | null | undefined;
    auth.restore().subscribe((person) => (result = person));

    httpTesting
      .expectOne('/api/auth/me')
      .flush({ title: 'Unauthorized', status: 401, detail: 'Sign in first.' }, { status: 401, statusText: 'Unauthorized' });

    expect(result).toBeNull();
    expect(auth.signedIn()).toBe(false);
  });

  it('signs in with the given email and password and keeps the person', () => {
    let signedIn: Person | undefined;
    auth.signIn('technician@lab.test', 'secret').subscribe((person) => (signedIn = person));

    const request = httpTesting.expectOne({ method: 'POST', url: '/api/auth/sign-in' });
    expect(request.request.body).toEqual({ email: 'technician@lab.test', password: 'secret' });
    request.flush({ person: { ...dana, role: 'technician' } });

    expect(signedIn?.role).toBe('technician');
    expect(auth.role()).toBe('technician');
  });

  it("fails sign-in with the server's problem detail and leaves nobody signed in", () => {
    const detail = 'The email or password is not right. 3 attempts left before the account locks for 15 minutes.';
    let problem: ProblemDetails | undefined;
    auth.signIn('technician@lab.test', 'wrong').subscribe({ error: (p: ProblemDetails) => (problem = p) });

    httpTesting
      .expectOne('/api/auth/sign-in')
      .flush(
        { type: 'about:blank', title: 'Sign-in refused', status: 401, detail },
        { status: 401, statusText: 'Unauthorized', headers: { 'content-type': 'application/problem+json' } },
      );

    expect(problem).toMatchObject({ status: 401, detail, title: 'Sign-in refused' });
    expect(auth.person()).toBeNull();
  });

  it('falls back to a plain message when a 429 carries no detail', () => {
    let problem: ProblemDetails | undefined;
    auth.signIn('a@lab.test', 'x').subscribe({ error: (p: ProblemDetails) => (problem = p) });

    httpTesting.expectOne('/api/auth/sign-in').flush('', { status: 429, statusText: 'Too Many Requests' });

    expect(problem?.status).toBe(429);
    expect(problem?.detail).toMatch(/wait a minute/i);
  });

  it('says the server cannot be reached when the request never got an answer', () => {
    let problem: ProblemDetails | undefined;
    auth.signIn('a@lab.test', 'x').subscribe({ error: (p: ProblemDetails) => (problem = p) });

    httpTesting.expectOne('/api/auth/sign-in').error(new ProgressEvent('error'));

    expect(problem?.status).toBe(0);
    expect(problem?.detail).toMatch(/can't be reached/);
  });

  it('forgets the person after signing out, even when the server call fails', () => {
    auth.restore().subscribe();
    httpTesting.expectOne('/api/auth/me').flush({ person: dana });

    let done = false;
    auth.signOut().subscribe({ complete: () => (done = true) });
    httpTesting.expectOne({ method: 'POST', url: '/api/auth/sign-out' }).flush('', { status: 500, statusText: 'Server Error' });

    expect(done).toBe(true);
    expect(auth.person()).toBeNull();
  });
});
