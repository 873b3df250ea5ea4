import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatInputHarness } from '@angular/material/input/testing';

import { CorrectionDialog } from './correction-dialog';

describe('CorrectionDialog', () => {
  let fixture: ComponentFixture<CorrectionDialog>;
  let loader: HarnessLoader;
  let httpTesting: HttpTestingController;
  let close: jest.Mock;

  beforeEach(async () => {
    close = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MAT_DIALOG_DATA, useValue: { runId: 7, code: 'R-2026-0007' } },
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CorrectionDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => httpTesting.verify());

  const start = () => loader.getHarness(MatButtonHarness.with({ text: 'Start the correction' }));
  const reason = () => loader.getHarness(MatInputHarness.with({ selector: 'textarea' }));

  it('asks for a reason of at least 5 characters before opening anything', async () => {
    await (await reason()).setValue('  typo ');
    await (await start()).click();

    httpTesting.expectNone('/api/runs/7/revisions');
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('Write at least 5 characters');
  });

  it('counts the reason against the server\'s limit of 2000 characters and opens nothing while it is over', async () => {
    // A paste: the textarea's value set at once.
    const area = (fixture.nativeElement as HTMLElement).querySelector('textarea')!;
    area.value = 'c'.repeat(2001);
    area.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('2001 / 2000');
    await (await start()).click();
    httpTesting.expectNone('/api/runs/7/revisions');
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('At most 2000 characters; shorten it by 1.');
  });

  it('opens the new draft revision with the trimmed reason and closes with its id', async () => {
    await (await reason()).setValue('  Pressure channel entered in gauge, not absolute  ');
    await (await start()).click();

    const request = httpTesting.expectOne({ method: 'POST', url: '/api/runs/7/revisions' });
    expect(request.request.body).toEqual({ reason: 'Pressure channel entered in gauge, not absolute' });
    request.flush({ id: 31, revision: 2 });
    expect(close).toHaveBeenCalledWith(31);
  });

  it("shows the server's reason when the correction is refused, and stays open", async () => {
    await (await reason()).setValue('Ambient pressure was from the wrong day');
    await (await start()).click();

    httpTesting
      .expectOne('/api/runs/7/revisions')
      .flush(
        { type: 'about:blank', title: 'Conflict', status: 409, detail: 'Run R-2026-0007 already has a newer revision.' },
        { status: 409, statusText: 'Conflict' },
      );
    await fixture.whenStable();

    expect((fixture.nativeElement as HTMLElement).querySelector('[role="alert"]')?.textContent).toContain(
      'already has a newer revision',
    );
    expect(close).not.toHaveBeenCalled();
    expect(await (await start()).isDisabled()).toBe(false);
  });
});
