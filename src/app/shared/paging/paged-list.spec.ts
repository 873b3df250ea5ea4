import { LiveAnnouncer } from '@angular/cdk/a11y';
import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { ParamMap, Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { Observable, Subject } from 'rxjs';

import { PageOf, PagedList } from './paged-list';

interface ShelfQuery {
  page: number;
  pageSize: number;
  shelf: string | null;
}
type ShelfPage = PageOf<{ id: number }>;

const DEFAULTS: ShelfQuery = { page: 1, pageSize: 25, shelf: null };
const requests: { query: ShelfQuery; answer: Subject<ShelfPage> }[] = [];
const refresh = new Subject<void>();
const shown: { page: number; silent: boolean; before: number | null }[] = [];

function shelfQueryFrom(params: ParamMap): ShelfQuery {
  const page = Number(params.get('page'));
  return { page: Number.isInteger(page) && page > 0 ? page : 1, pageSize: 25, shelf: params.get('shelf') };
}

function load(query: ShelfQuery): Observable<ShelfPage> {
  const answer = new Subject<ShelfPage>();
  requests.push({ query, answer });
  return answer;
}

@Component({ selector: 'qw-shelf-list', template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class ShelfList {
  readonly list = new PagedList<ShelfQuery, ShelfPage>({
    queryFrom: shelfQueryFrom,
    defaults: DEFAULTS,
    load,
    plural: 'Shelves',
    refresh,
    shown: (page, silent, before) => shown.push({ page: page.page, silent, before: before?.page ?? null }),
  });
}

describe('PagedList', () => {
  let harness: RouterTestingHarness;
  let announce: jest.SpyInstance;

  beforeEach(async () => {
    requests.length = 0;
    shown.length = 0;
    TestBed.configureTestingModule({ providers: [provideRouter([{ path: 'shelves', component: ShelfList }])] });
    announce = jest.spyOn(TestBed.inject(LiveAnnouncer), 'announce').mockResolvedValue();
    harness = await RouterTestingHarness.create();
  });

  async function open(url: string): Promise<PagedList<ShelfQuery, ShelfPage>> {
    const page = await harness.navigateByUrl(url, ShelfList);
    return page.list;
  }

  const pageOf = (page: number, total: number): ShelfPage => ({ items: [{ id: page }], total, page, pageSize: 25 });

  it('loads the page the address names and announces the range shown', async () => {
    const list = await open('/shelves?page=2&shelf=B');
    expect(requests.map((r) => r.query)).toEqual([{ page: 2, pageSize: 25, shelf: 'B' }]);
    expect(list.loading()).toBe(true);

    requests[0].answer.next(pageOf(2, 60));
    expect(list.loading()).toBe(false);
    expect(list.result()?.total).toBe(60);
    expect(announce).toHaveBeenCalledWith('Shelves 26 to 50 of 60 shown.', 'polite');
  });

  it('keeps loading later pages after one fails', async () => {
    const list = await open('/shelves');
    requests[0].answer.error(new HttpErrorResponse({ status: 503, error: { detail: 'The database is restarting.' } }));
    expect(list.problem()?.detail).toBe('The database is restarting.');
    expect(list.loading()).toBe(false);

    list.turnPage({ pageIndex: 1, pageSize: 25, length: 60 });
    await harness.fixture.whenStable();
    expect(requests[1].query.page).toBe(2);
    requests[1].answer.next(pageOf(2, 60));
    expect(list.problem()).toBeNull();
    expect(list.result()?.page).toBe(2);
  });

  it('leaves values equal to the defaults out of the address', async () => {
    const list = await open('/shelves?shelf=B&page=3');
    list.update({ shelf: null, page: 1 });
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/shelves');
  });

  it('re-reads the current page silently when asked, telling the page what was shown before', async () => {
    const list = await open('/shelves?page=2');
    requests[0].answer.next(pageOf(2, 60));
    announce.mockClear();

    refresh.next();
    expect(requests[1].query).toEqual(list.query());
    expect(list.loading()).toBe(false);
    requests[1].answer.next(pageOf(2, 61));

    expect(announce).not.toHaveBeenCalled();
    expect(shown).toEqual([
      { page: 2, silent: false, before: null },
      { page: 2, silent: true, before: 2 },
    ]);
    expect(list.result()?.total).toBe(61);
  });
});
