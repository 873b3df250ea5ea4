import { HttpErrorResponse } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { FormControl, FormGroup, Validators } from '@angular/forms';
import { MatDialogRef } from '@angular/material/dialog';
import { Subject, of, throwError } from 'rxjs';

import { DialogSave, DialogSaveOptions } from './dialog-save';

interface Saved {
  id: number;
  tag: string;
}

describe('DialogSave', () => {
  let close: jest.Mock;
  let form: FormGroup<{ tag: FormControl<string>; ratedPressureValue: FormControl<number | null> }>;

  beforeEach(() => {
    close = jest.fn();
    TestBed.configureTestingModule({ providers: [{ provide: MatDialogRef, useValue: { close } }] });
    form = new FormGroup({
      tag: new FormControl('PC-4', { nonNullable: true, validators: Validators.required }),
      ratedPressureValue: new FormControl<number | null>(null),
    });
  });

  function saver(options?: DialogSaveOptions): DialogSave<Saved> {
    return TestBed.runInInjectionContext(() => new DialogSave<Saved>(form, options));
  }

  function refusal(status: number, body: object): HttpErrorResponse {
    return new HttpErrorResponse({ status, error: { type: 'about:blank', title: 'Refused', status, ...body } });
  }

  it('sends nothing while the form is invalid, and shows every field error', () => {
    const save = saver();
    const request = jest.fn(() => of({ id: 1, tag: '' }));
    form.controls.tag.setValue('');

    save.submit(request);

    expect(request).not.toHaveBeenCalled();
    expect(form.controls.tag.touched).toBe(true);
    expect(save.saving()).toBe(false);
  });

  it('sends one request at a time and closes the dialog with what the server stored', () => {
    const save = saver();
    const answer = new Subject<Saved>();
    const request = jest.fn(() => answer);

    save.submit(request);
    save.submit(request);
    expect(request).toHaveBeenCalledTimes(1);
    expect(save.saving()).toBe(true);

    answer.next({ id: 7, tag: 'PC-4' });
    expect(close).toHaveBeenCalledWith({ id: 7, tag: 'PC-4' });
  });

  it('marks a 409 on the field it is about, with the sentence given', () => {
    const save = saver({ conflict: { control: form.controls.tag, message: 'This tag is already in the register.' } });

    save.submit(() => throwError(() => refusal(409, { detail: 'Apparatus PC-4 exists already.' })));

    expect(save.saving()).toBe(false);
    expect(save.problem()?.detail).toBe('Apparatus PC-4 exists already.');
    expect(form.controls.tag.getError('server')).toBe('This tag is already in the register.');
    expect(close).not.toHaveBeenCalled();
  });

  it("puts a 400's field messages beside their fields and lists the ones no field took", () => {
    const save = saver({ fieldNames: { ratedPressure: 'ratedPressureValue' } });

    save.submit(() =>
      throwError(() =>
        refusal(400, {
          detail: 'Two fields need changes.',
          errors: [
            { field: 'ratedPressure', message: 'ratedPressure must not be negative' },
            { field: 'notes', message: 'notes must be text' },
          ],
        }),
      ),
    );

    expect(form.controls.ratedPressureValue.getError('server')).toBe('ratedPressure must not be negative');
    expect(save.otherMessages()).toEqual(['notes must be text']);
    // A 400 is no conflict: the tag keeps no server error.
    expect(form.controls.tag.hasError('server')).toBe(false);
  });

  it('lets the dialog reword a refusal, and a later attempt clears the last one', () => {
    const save = saver({ refused: (problem) => ({ ...problem, detail: `${problem.detail} Reload and try again.` }) });

    save.submit(() => throwError(() => refusal(409, { detail: 'Someone else changed it.' })));
    expect(save.problem()?.detail).toBe('Someone else changed it. Reload and try again.');

    const answer = new Subject<Saved>();
    save.submit(() => answer);
    expect(save.problem()).toBeNull();
    expect(save.otherMessages()).toEqual([]);
  });
});
