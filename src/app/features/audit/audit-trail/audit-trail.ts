import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DatePipe, JsonPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { catchError, of } from 'rxjs';

import { ProblemDetails, toProblem } from '../../../core/http/problem-details';
import { PagedList } from '../../../shared/paging/paged-list';
import { ProblemBanner } from '../../../shared/problem-banner/problem-banner';
import { AuditApi } from '../audit-api';
import {
  AuditEvent,
  AuditPage,
  AuditQuery,
  ChainCheck,
  ExportFormat,
  KNOWN_ACTIONS,
  RECORD_TYPES,
} from '../audit.models';
import { AUDIT_PAGE_SIZES, DEFAULT_AUDIT_QUERY, auditQueryFrom, runCode } from './audit-query';

const EXPORT_FORMATS: readonly { format: ExportFormat; label: string; icon: string }[] = [
  { format: 'xlsx', label: 'Workbook (.xlsx)', icon: 'table_view' },
  { format: 'csv', label: 'CSV', icon: 'description' },
  { format: 'pdf', label: 'PDF report', icon: 'picture_as_pdf' },
];

/** The audit trail: filtered in the address, paged on the server, with the chain check and exports. */
@Component({
  selector: 'qw-audit-trail',
  imports: [
    DatePipe,
    JsonPipe,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
    ProblemBanner,
    ReactiveFormsModule,
  ],
  templateUrl: './audit-trail.html',
  styleUrl: './audit-trail.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'page' },
})
export class AuditTrail {
  private readonly api = inject(AuditApi);
  private readonly announcer = inject(LiveAnnouncer);

  /** People who appear in the trail, for the person filter. */
  protected readonly actors = toSignal(this.api.actors().pipe(catchError(() => of([]))), { initialValue: [] });

  protected readonly columns = ['occurredAt', 'who', 'action', 'record', 'reason', 'expand'];
  protected readonly pageSizes = AUDIT_PAGE_SIZES;
  protected readonly actions = KNOWN_ACTIONS;
  protected readonly recordTypes = RECORD_TYPES;
  protected readonly exportFormats = EXPORT_FORMATS;

  protected readonly expanded = signal<number | null>(null);
  protected readonly checking = signal(false);
  protected readonly chain = signal<ChainCheck | null>(null);
  protected readonly chainProblem = signal<ProblemDetails | null>(null);

  protected readonly filterForm = inject(FormBuilder).group({
    run: [''],
    hideSignIns: [false],
    person: [null as number | null],
    action: [''],
    entityType: [''],
    from: [''],
    to: [''],
  });
  protected readonly list = new PagedList<AuditQuery, AuditPage>({
    queryFrom: auditQueryFrom,
    defaults: DEFAULT_AUDIT_QUERY,
    load: (query) => this.api.list(query),
    plural: 'Events',
    queryChanged: (query) => {
      this.expanded.set(null);
      this.showFilters(query);
    },
  });
  protected readonly exportLinks = computed(() =>
    EXPORT_FORMATS.map((entry) => ({ ...entry, href: this.api.exportUrl(entry.format, this.list.query()) })),
  );
  protected readonly activeFilterCount = computed(() => {
    const { page: _page, pageSize: _size, ...filters } = this.list.query();
    return Object.values(filters).filter((value) => value !== null && value !== false).length;
  });

  protected applyFilters(): void {
    const value = this.filterForm.getRawValue();
    this.list.update({
      run: runCode(value.run ?? null),
      hideSignIns: value.hideSignIns ?? false,
      person: value.person || null,
      action: value.action?.trim() || null,
      entityType: value.entityType || null,
      from: value.from || null,
      to: value.to || null,
      page: 1,
    });
  }

  protected clearFilters(): void {
    this.list.update({ ...DEFAULT_AUDIT_QUERY, pageSize: this.list.query().pageSize });
  }

  protected filterByPerson(event: AuditEvent): void {
    this.list.update({ person: event.actorId, page: 1 });
  }

  protected toggleEvent(event: AuditEvent): void {
    this.expanded.update((id) => (id === event.id ? null : event.id));
  }

  protected verifyChain(): void {
    this.checking.set(true);
    this.chain.set(null);
    this.chainProblem.set(null);
    this.api.verify().subscribe({
      next: (check) => {
        this.checking.set(false);
        this.chain.set(check);
        void this.announcer.announce(this.chainSentence(check), 'assertive');
      },
      error: (error: unknown) => {
        const problem = toProblem(error);
        this.checking.set(false);
        this.chainProblem.set(problem);
        void this.announcer.announce(`The chain could not be checked. ${problem.detail}`, 'assertive');
      },
    });
  }

  protected emailParts(email: string | null): [string, string] {
    const at = email?.indexOf('@') ?? -1;
    return email && at > 0 ? [email.slice(0, at), email.slice(at)] : [email ?? '', ''];
  }

  /** One sentence that says what the check found, for the page and for screen readers alike. */
  protected chainSentence(check: ChainCheck): string {
    if (check.valid) {
      return `The audit chain is intact: all ${check.checked} events checked, none altered.`;
    }
    const broken = check.firstBroken;
    return broken
      ? `The audit chain is broken at event ${broken.id}: ${broken.reason}. ${check.checked} events checked.`
      : `The audit chain is broken. ${check.checked} events checked.`;
  }

  private showFilters(query: AuditQuery): void {
    this.filterForm.setValue({
      run: query.run ?? '',
      hideSignIns: query.hideSignIns,
      person: query.person,
      action: query.action ?? '',
      entityType: query.entityType ?? '',
      from: query.from ?? '',
      to: query.to ?? '',
    });
  }
}
