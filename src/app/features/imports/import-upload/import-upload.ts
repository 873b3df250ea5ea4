import { HttpEventType } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { Subscription } from 'rxjs';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { ImportsApi } from '../imports-api';
import { ImportPreview, UploadOptions } from '../imports.models';

/** Step 1: choose or drop a logger file, say how a CSV is written, upload it with progress. */
@Component({
  selector: 'qw-import-upload',
  imports: [ProblemBanner, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatSelectModule],
  templateUrl: './import-upload.html',
  styleUrl: './import-upload.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportUpload {
  private readonly api = inject(ImportsApi);
  private running: Subscription | null = null;

  /** The preview, once the server has read the file. */
  readonly uploaded = output<ImportPreview>();

  protected readonly delimiter = signal<UploadOptions['delimiter']>('');
  protected readonly sheet = signal('');
  protected readonly decimalComma = signal(false);
  protected readonly dragging = signal(false);
  protected readonly fileName = signal<string | null>(null);
  /** Percent sent, or null when no upload is running. */
  protected readonly progress = signal<number | null>(null);
  protected readonly problem = signal<ProblemDetails | null>(null);

  constructor() {
    inject(DestroyRef).onDestroy(() => this.running?.unsubscribe());
  }

  protected chooseFile(input: HTMLInputElement): void {
    const file = input.files?.[0];
    input.value = '';
    if (file) this.uploadFile(file);
  }

  protected dragOver(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(true);
  }

  protected dropFile(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    const file = event.dataTransfer?.files?.[0];
    if (file) this.uploadFile(file);
  }

  uploadFile(file: File): void {
    this.running?.unsubscribe();
    this.problem.set(null);
    this.fileName.set(file.name);
    this.progress.set(0);
    const options: UploadOptions = { delimiter: this.delimiter(), decimal: this.decimalComma() ? ',' : '', sheet: this.sheet() };
    this.running = this.api.upload(file, options).subscribe({
      next: (event) => {
        if (event.type === HttpEventType.UploadProgress) {
          this.progress.set(event.total ? Math.round((100 * event.loaded) / event.total) : 0);
        } else if (event.type === HttpEventType.Response && event.body) {
          this.progress.set(null);
          this.uploaded.emit(event.body);
        }
      },
      error: (error: unknown) => {
        this.progress.set(null);
        this.problem.set(toProblem(error));
      },
    });
  }
}
