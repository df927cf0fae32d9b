import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { AuditEntry, Person } from '@loadwright/contracts';
import { catchError, of } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { PeopleClient } from '../people/people-client';
import { ACTION_FAMILIES, actionName, actorName, detailSummary, targetName } from './action-names';
import { AuditClient, type AuditFilter } from './audit-client';

/** The audit log (admins): who did what, when and from where; filtered by action, person and dates, paged backwards. */
@Component({
  selector: 'lw-audit-log',
  imports: [DatePipe, ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './audit-log.html',
  styleUrl: './audit-log.scss',
})
export class AuditLog {
  private readonly audit = inject(AuditClient);

  /** The filter form; dates are calendar days in the browser's time zone. */
  protected readonly filters = inject(NonNullableFormBuilder).group({ action: [''], actorUserId: [0], fromDay: [''], toDay: [''] });
  /** People to filter by (the list is empty if it cannot be read; the log still works). */
  protected readonly people = toSignal(
    inject(PeopleClient)
      .list()
      .pipe(catchError(() => of<Person[]>([]))),
    { initialValue: [] as Person[] },
  );
  /** Action families to filter by. */
  protected readonly families = ACTION_FAMILIES;
  /** Entries read so far, newest first; null while the first page loads. */
  protected readonly entries = signal<AuditEntry[] | null>(null);
  /** Where the next page starts, or null when the oldest entry is shown. */
  protected readonly nextBefore = signal<number | null>(null);
  /** True while a page is loading. */
  protected readonly loading = signal(false);
  /** Why the log could not be read. */
  protected readonly problem = signal<string | null>(null);
  /** Readable name of an action code, for the template. */
  protected readonly actionName = actionName;
  /** Readable name of whoever acted, for the template. */
  protected readonly actorName = actorName;
  /** An entry's detail as short pairs, for the template. */
  protected readonly detailSummary = detailSummary;
  /** What an entry acted on, for the template. */
  protected readonly targetName = targetName;

  /** The filter in force for the pages shown. */
  private activeFilter: AuditFilter = {};

  constructor() {
    this.applyFilters();
  }

  /** Reads the first page for the filters as they stand. */
  protected applyFilters(): void {
    const { action, actorUserId, fromDay, toDay } = this.filters.getRawValue();
    this.activeFilter = {
      action: action || undefined,
      actorUserId: actorUserId || undefined,
      from: fromDay ? startOfDay(fromDay).toISOString() : undefined,
      // The whole "to" day counts: up to the last millisecond before the next midnight.
      to: toDay ? new Date(startOfDay(toDay).getTime() + 86_400_000 - 1).toISOString() : undefined,
    };
    this.entries.set(null);
    this.readPage();
  }

  /** Clears every filter and reads the newest entries. */
  protected clearFilters(): void {
    this.filters.reset();
    this.applyFilters();
  }

  /** Appends the next, older page. */
  protected readOlder(): void {
    this.readPage(this.nextBefore() ?? undefined);
  }

  /** Reads one page and appends it. */
  private readPage(before?: number): void {
    this.loading.set(true);
    this.problem.set(null);
    this.audit.page(this.activeFilter, before).subscribe({
      next: (page) => {
        this.loading.set(false);
        this.entries.update((entries) => [...(before === undefined ? [] : (entries ?? [])), ...page.entries]);
        this.nextBefore.set(page.nextBefore);
      },
      error: (error: unknown) => {
        this.loading.set(false);
        this.problem.set(problemMessage(error));
      },
    });
  }
}

/** Local midnight at the start of a yyyy-mm-dd day. */
function startOfDay(day: string): Date {
  const [year, month, date] = day.split('-').map(Number) as [number, number, number];
  return new Date(year, month - 1, date);
}
