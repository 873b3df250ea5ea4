import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

import { SIGNATURE_MEANINGS, TEXT_LIMITS } from '@contract';

// The rule the server validates a signature's meaning with (pure; imported here so this spec fails when it changes).
import { meaningsAccepted } from '../../../../../server/runs/signature-meanings';
import { BalanceResult, ReviewAction } from '../run-detail.models';
import { ReviewDialog, ReviewDialogData } from './review-dialog';

function resultWith(verdict: BalanceResult['verdict'], En: number): BalanceResult {
  return {
    verdict,
    En,
    residual: { r: -36.00798, u: 13.825, U: 27.6506, k: 2 },
  } as BalanceResult;
}

describe('ReviewDialog', () => {
  let fixture: ComponentFixture<ReviewDialog>;
  let loader: HarnessLoader;
  let httpTesting: HttpTestingController;
  let close: jest.Mock;

  async function open(action: ReviewAction, verdict: BalanceResult['verdict'] = 'closes'): Promise<void> {
    close = jest.fn();
    const data: ReviewDialogData = {
      runId: 7,
      code: 'R-2026-0007',
      title: 'Bath calorimeter check',
      version: 4,
      action,
      result: resultWith(verdict, verdict === 'breaks' ? 1.3 : 0.4),
    };
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MAT_DIALOG_DATA, useValue: data },
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ReviewDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  afterEach(() => httpTesting.verify());

  const text = () => (fixture.nativeElement as HTMLElement).textContent ?? '';
  const password = () => loader.getHarness(MatInputHarness.with({ selector: '[type="password"]' }));
  const reason = () => loader.getHarness(MatInputHarness.with({ selector: 'textarea' }));
  const signButton = () => loader.getHarness(MatButtonHarness.with({ text: /^Sign and/ }));

  it('shows the verdict, En and r ± U up front', async () => {
    await open('approve', 'breaks');
    expect(fixture.nativeElement.querySelector('qw-verdict-display')?.textContent).toContain('Breaks');
    expect(text()).toContain('= 1.30');
    expect(text()).toContain('r = \u221236 ± 28 J (k = 2)');
  });

  it.each([
    ['approve', meaningsAccepted('approve')],
    ['return', meaningsAccepted('return')],
    ['reject', meaningsAccepted('reject')],
  ] as const)('offers exactly the meanings the server accepts for %s', async (action, meanings) => {
    await open(action);
    const select = await loader.getHarness(MatSelectHarness);
    await select.open();
    const options = await select.getOptions();
    expect(await Promise.all(options.map((option) => option.getText()))).toEqual([...meanings]);
  });

  it('asks for a justification of 20 characters before approving a breaking run', async () => {
    await open('approve', 'breaks');
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: /Justification/ }));
    expect(field).toBeTruthy();

    await (await password()).setValue('secret-pass');
    const select = await loader.getHarness(MatSelectHarness);
    await select.open();
    await select.clickOptions({ text: SIGNATURE_MEANINGS.approve[0] });
    await (await reason()).setValue('Too short.');
    await (await signButton()).click();

    httpTesting.expectNone('/api/runs/7/approve');
    expect(text()).toContain('Write at least 20 characters saying why this run should be approved.');

    await (await reason()).setValue('Heat leak known from the cooling curve of BC-1.');
    await (await signButton()).click();
    const request = httpTesting.expectOne('/api/runs/7/approve');
    expect(request.request.body).toEqual({
      version: 4,
      password: 'secret-pass',
      meaning: SIGNATURE_MEANINGS.approve[0],
      reason: 'Heat leak known from the cooling curve of BC-1.',
    });
    request.flush({ state: 'approved' });
    expect(close).toHaveBeenCalledWith('approve');
  });

  it('counts the reason against the server\'s limit and sends nothing while it is over', async () => {
    await open('return');
    expect(TEXT_LIMITS.signatureReason).toBe(4000); // server/runs/review-dto.ts checks the same constant
    await (await password()).setValue('pa55word!');
    // Typed into the textarea at once (a paste): key by key would take thousands of events.
    const area = (fixture.nativeElement as HTMLElement).querySelector('textarea')!;
    area.value = 'r'.repeat(4001);
    area.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(text()).toContain('4001 / 4000');
    await (await signButton()).click();
    httpTesting.expectNone('/api/runs/7/return');
    expect(text()).toContain('At most 4000 characters; shorten it by 1.');

    area.value = 'r'.repeat(4000);
    area.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(text()).toContain('4000 / 4000');
    await (await signButton()).click();
    const request = httpTesting.expectOne('/api/runs/7/return');
    expect(request.request.body.reason).toHaveLength(4000);
  });

  it('asks for a justification before approving an indeterminate check, and says why', async () => {
    await open('approve', 'indeterminate');
    expect(await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: /Justification/ }))).toBeTruthy();
    expect(text()).toContain('The check of this run is indeterminate');
    await (await password()).setValue('secret-pass');
    await (await reason()).setValue('Looks fine.');
    await (await signButton()).click();
    httpTesting.expectNone('/api/runs/7/approve');
    expect(text()).toContain('Write at least 20 characters saying why this run should be approved.');
  });

  it('posts a return with the version read, the password, the only meaning and the reason', async () => {
    await open('return');
    await (await password()).setValue('pa55word!');
    await (await reason()).setValue('  Ambient pressure is missing.  ');
    await (await signButton()).click();

    const request = httpTesting.expectOne('/api/runs/7/return');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      version: 4,
      password: 'pa55word!',
      meaning: SIGNATURE_MEANINGS.return[0],
      reason: 'Ambient pressure is missing.',
    });
    request.flush({ state: 'returned' });
    expect(close).toHaveBeenCalledWith('return');
  });

  it("shows the server's 401 detail inline, clears the password and stays open", async () => {
    await open('reject');
    await (await password()).setValue('wrong');
    await (await reason()).setValue('Readings copied from another run.');
    await (await signButton()).click();

    httpTesting.expectOne('/api/runs/7/reject').flush(
      { title: 'Unauthorized', status: 401, detail: 'That password is not right. Your signature was not recorded.' },
      { status: 401, statusText: 'Unauthorized' },
    );
    await fixture.whenStable();

    expect(fixture.nativeElement.querySelector('[role="alert"]')?.textContent).toContain(
      'That password is not right. Your signature was not recorded.',
    );
    expect(await (await password()).getValue()).toBe('');
    expect(close).not.toHaveBeenCalled();
  });

  it('shows the lockout (423) with its wait, clears the password and stays open', async () => {
    await open('reject');
    await (await password()).setValue('wrong-again');
    await (await reason()).setValue('Readings copied from another run.');
    await (await signButton()).click();

    httpTesting.expectOne('/api/runs/7/reject').flush(
      { title: 'Account locked', status: 423, detail: 'This account is locked after too many failed password attempts. Try again in 15 minutes.' },
      { status: 423, statusText: 'Locked' },
    );
    await fixture.whenStable();

    expect(fixture.nativeElement.querySelector('[role="alert"]')?.textContent).toContain('locked after too many failed password attempts. Try again in 15 minutes.');
    expect(await (await password()).getValue()).toBe('');
    expect(close).not.toHaveBeenCalled();
  });

  it("puts a 400's field messages beside their fields and the rest in the alert", async () => {
    await open('return');
    await (await password()).setValue('pa55word!');
    await (await reason()).setValue('Units of the volume channel.');
    await (await signButton()).click();

    httpTesting.expectOne('/api/runs/7/return').flush(
      {
        title: 'Bad Request', status: 400, detail: 'The signature request has problems.',
        errors: [{ field: 'reason', message: 'reason: say which reading is wrong.' }, { field: 'version', message: 'version must be a whole number.' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    const reasonField = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: /Reason/ }));
    expect(await reasonField.getTextErrors()).toEqual(['reason: say which reading is wrong.']);
    const alert = fixture.nativeElement.querySelector('[role="alert"]')?.textContent ?? '';
    expect(alert).toContain('The signature request has problems.');
    expect(alert).toContain('version must be a whole number.');
    expect(alert).not.toContain('say which reading is wrong');
    // The password is kept: nothing said it was wrong.
    expect(await (await password()).getValue()).toBe('pa55word!');
  });

  it('tells the reviewer to reload when the run changed meanwhile (409)', async () => {
    await open('return');
    await (await password()).setValue('pa55word!');
    await (await reason()).setValue('Units of the volume channel.');
    await (await signButton()).click();

    httpTesting.expectOne('/api/runs/7/return').flush(
      { title: 'Conflict', status: 409, detail: 'Run R-2026-0007 changed since you read it (version 5).' },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();

    expect(fixture.nativeElement.querySelector('[role="alert"]')?.textContent).toContain('reload the run');
  });
});
