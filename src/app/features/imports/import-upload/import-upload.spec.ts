import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';

import { ImportPreview } from '../imports.models';
import { ImportUpload } from './import-upload';

describe('ImportUpload', () => {
  let httpTesting: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    httpTesting = TestBed.inject(HttpTestingController);
  });

  afterEach(() => httpTesting.verify());

  async function setUp() {
    const fixture = TestBed.createComponent(ImportUpload);
    await fixture.whenStable();
    const uploaded: ImportPreview[] = [];
    fixture.componentInstance.uploaded.subscribe((p) => uploaded.push(p));
    return { fixture, el: fixture.nativeElement as HTMLElement, uploaded };
  }

  it('sends the file as multipart with the CSV options, shows the progress and hands on the preview', async () => {
    const { fixture, el, uploaded } = await setUp();
    const file = new File(['Zeit;P (kPa)\n0;101,3\n'], 'bench-logger.csv', { type: 'text/csv' });
    // The options a person sets for a ";" file with decimal commas.
    el.querySelector<HTMLInputElement>('mat-checkbox input')!.click();
    (fixture.componentInstance as unknown as { delimiter: { set(v: string): void } }).delimiter.set(';');
    fixture.componentInstance.uploadFile(file);
    await fixture.whenStable();

    const req = httpTesting.expectOne('/api/imports');
    expect(req.request.method).toBe('POST');
    const body = req.request.body as FormData;
    expect((body.get('file') as File).name).toBe('bench-logger.csv');
    expect([body.get('delimiter'), body.get('decimal'), body.get('sheet')]).toEqual([';', ',', null]);
    expect(req.request.reportProgress).toBe(true);

    req.event({ type: HttpEventType.UploadProgress, loaded: 42, total: 100 });
    await fixture.whenStable();
    expect(el.textContent).toContain('Uploading bench-logger.csv: 42 %');
    expect(el.querySelector('mat-progress-bar')?.getAttribute('aria-valuenow')).toBe('42');

    req.flush({ importId: 7, filename: 'bench-logger.csv' });
    await fixture.whenStable();
    expect(uploaded.map((p) => p.importId)).toEqual([7]);
    expect(el.querySelector('mat-progress-bar')).toBeNull();
  });

  it('shows the problem detail when the server refuses the file (415)', async () => {
    const { fixture, el, uploaded } = await setUp();
    fixture.componentInstance.uploadFile(new File(['%PDF-1.7'], 'report.pdf'));
    httpTesting.expectOne('/api/imports').flush(
      { type: 'about:blank', title: 'Not a spreadsheet Qwell reads', status: 415, detail: '"report.pdf" is not a spreadsheet Qwell reads (it is a PDF document). Upload a .xlsx workbook or a .csv file exported from the logger.' },
      { status: 415, statusText: 'Unsupported Media Type' },
    );
    await fixture.whenStable();
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('"report.pdf" is not a spreadsheet Qwell reads (it is a PDF document)');
    // Said by the shared problem banner, under the page's words for what failed
    const banner = el.querySelector('qw-problem-banner [role="alert"]');
    expect(banner?.querySelector('.problem-title')?.textContent?.trim()).toBe('The file was not read.');
    expect(banner?.querySelector('.problem-detail')?.textContent).toContain('Upload a .xlsx workbook or a .csv file exported from the logger.');
    expect(el.querySelectorAll('[role="alert"]')).toHaveLength(1);
    expect(uploaded).toEqual([]);
  });

  it('takes a dropped file and offers a keyboard-reachable button', async () => {
    const { fixture, el } = await setUp();
    const button = Array.from(el.querySelectorAll('button')).find((b) => b.textContent?.includes('Choose a file'));
    expect(button?.disabled).toBe(false);
    const file = new File(['Time (s),P (kPa)\n0,1\n'], 'drop.csv');
    const drop = new Event('drop') as DragEvent;
    Object.defineProperty(drop, 'dataTransfer', { value: { files: [file] } });
    el.querySelector('.drop-zone')!.dispatchEvent(drop);
    await fixture.whenStable();
    const req = httpTesting.expectOne('/api/imports');
    expect(((req.request.body as FormData).get('file') as File).name).toBe('drop.csv');
    req.flush({ importId: 1 });
  });
});
