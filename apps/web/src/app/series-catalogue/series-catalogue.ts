import { zonedClock } from '../series-page/zoned-time';
import { DecimalPipe, LowerCasePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import {
  type SeriesDetail,
  type SeriesPage,
  type SeriesReadingStats,
  type SeriesSortKey,
  type SeriesSummary,
  seriesKinds,
  seriesLevels,
} from '@loadwright/contracts';
import { EMPTY, Subject, catchError, debounceTime, distinctUntilChanged, filter, map, mergeMap, of, startWith, switchMap, tap } from 'rxjs';
import { SessionStore } from '../core/auth/session-store';
import { problemMessage } from '../core/problems/api-problem';
import { confirmAction } from '../shared/confirm-dialog/confirm-dialog';
import { type CatalogueQuery, queryFromUrl, queryToUrl } from './catalogue-query';
import { type NetworkNode, networkTree } from './network-tree';
import { flaggedCounts, qualitySentence } from './quality-counts';
import { SeriesClient } from './series-client';
import { type SeriesDialogData, SeriesFormDialog } from './series-form-dialog';

/** Table columns that sort on the server, by the sort key the API knows them by. */
const sortableColumns: Readonly<Record<string, SeriesSortKey>> = { key: 'key', name: 'name', level: 'level' };

/** How many series' reading counts are read at once beside a page. */
const statsConcurrency = 4;

/** Words for interval lengths. */
const intervalWords: Readonly<Partial<Record<number, string>>> = { 5: '5 min', 15: '15 min', 30: '30 min', 60: 'Hourly', 1440: 'Daily' };

/**
 * The series catalogue: every load and temperature series with filters (text, kind, level, a part of
 * the network), server-side sort and paging, and each series' reading counts by quality flag. The
 * filters live in the address bar so a filtered view can be shared. Stewards and admins add, edit,
 * archive and restore series.
 */
@Component({
  selector: 'lw-series-catalogue',
  imports: [
    DecimalPipe,
    LowerCasePipe,
    FormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    MatTooltipModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './series-catalogue.html',
  styleUrl: './series-catalogue.scss',
})
export class SeriesCatalogue {
  private readonly client = inject(SeriesClient);
  /** "Tue 2 Dec 17:00 CST": a series' time in its own zone, named, as on its series page. */
  protected readonly localClock = zonedClock;
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);
  private readonly destroyRef = inject(DestroyRef);
  private readonly session = inject(SessionStore);

  /** The filters, sort and page, read from the address bar. */
  protected readonly query = toSignal(this.route.queryParamMap.pipe(map(queryFromUrl)), { requireSync: true });
  /** The page of series shown, or null while the first one loads. */
  protected readonly page = signal<SeriesPage | null>(null);
  /** True while a page loads. */
  protected readonly loading = signal(false);
  /** Reading counts of the series on the page, by id, as they arrive. */
  protected readonly stats = signal<ReadonlyMap<number, SeriesReadingStats>>(new Map());
  /** Systems, zones and substations for the hierarchy filter and the form. */
  protected readonly network = signal<NetworkNode[]>([]);
  /** Weather stations, for the form. */
  private readonly stations = signal<SeriesSummary[]>([]);
  /** Why the catalogue could not be read or an action failed. */
  protected readonly problem = signal<string | null>(null);
  /** What the last action did, announced politely. */
  protected readonly outcome = signal<string | null>(null);
  /** True for stewards and admins, who may change the catalogue (the API checks the same permission). */
  protected readonly canEdit = computed(() => this.session.can('series.edit'));
  /** The columns shown: the actions column only for those who may edit. */
  protected readonly columns = computed(() => [
    'key',
    'name',
    'level',
    'unit',
    'interval',
    'timeZone',
    'latest',
    'quality',
    ...(this.canEdit() ? ['actions'] : []),
  ]);
  /** The table's sort state in Material's terms. */
  protected readonly sortColumn = computed(
    () => Object.entries(sortableColumns).find(([, key]) => key === this.query().sort)?.[0] ?? 'key',
  );
  /** The hierarchy node filtered on, for the page heading. */
  protected readonly underNode = computed(() => this.network().find((node) => node.key === this.query().under) ?? null);
  /** Choices of the pickers. */
  protected readonly kinds = seriesKinds;
  protected readonly levels = seriesLevels;
  protected readonly intervalWords = intervalWords;
  protected readonly flaggedCounts = flaggedCounts;
  protected readonly qualitySentence = qualitySentence;
  /** Text typed in the search box, sent after a pause. */
  protected readonly searchText = signal(this.query().text);
  private readonly typed = new Subject<string>();
  private readonly reload = new Subject<void>();

  constructor() {
    this.typed.pipe(debounceTime(300), distinctUntilChanged(), takeUntilDestroyed()).subscribe((text) => this.change({ text }));
    this.route.queryParamMap
      .pipe(
        map(queryFromUrl),
        switchMap((query) =>
          this.reload.pipe(
            map(() => query),
            startWith(query),
          ),
        ),
        tap(() => this.loading.set(true)),
        switchMap((query) =>
          this.client.list(query).pipe(
            catchError((error: unknown) => {
              this.loading.set(false);
              this.problem.set(problemMessage(error));
              return EMPTY;
            }),
          ),
        ),
        tap((page) => {
          this.loading.set(false);
          this.problem.set(null);
          this.page.set(page);
          this.stats.set(new Map());
        }),
        // Reading counts come per series; a new page cancels the counts still on their way.
        switchMap((page) =>
          of(...page.items).pipe(mergeMap((series) => this.client.get(series.id).pipe(catchError(() => EMPTY)), statsConcurrency)),
        ),
        takeUntilDestroyed(),
      )
      .subscribe((detail: SeriesDetail) => this.stats.update((stats) => new Map(stats).set(detail.id, detail.readings)));
    this.loadNetwork();
  }

  /** Reads the systems, zones, substations and weather stations once for the filter and the form. */
  private loadNetwork(): void {
    this.client
      .list({ text: '', kind: null, level: null, under: null, archived: 'false', sort: 'key', order: 'asc', pageIndex: 0, pageSize: 200 })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (page) => {
          this.network.set(networkTree(page.items));
          this.stations.set(page.items.filter((s) => s.kind === 'temperature'));
        },
        error: () => this.network.set([]),
      });
  }

  /** Puts a changed filter, sort or page into the address bar (filters go back to the first page). */
  protected change(patch: Partial<CatalogueQuery>): void {
    const next = { ...this.query(), ...('pageIndex' in patch ? {} : { pageIndex: 0 }), ...patch };
    void this.router.navigate([], { relativeTo: this.route, queryParams: queryToUrl(next), replaceUrl: true });
  }

  /** Sends the search text after a pause. */
  protected search(text: string): void {
    this.searchText.set(text);
    this.typed.next(text);
  }

  /** Applies a header click: sort by that column, or back to the key when the sort is cleared. */
  protected sortBy(sort: Sort): void {
    const key = sortableColumns[sort.active] ?? 'key';
    this.change({ sort: sort.direction ? key : 'key', order: sort.direction || 'asc' });
  }

  /** Applies the paginator. */
  protected turnPage(event: PageEvent): void {
    this.change({ pageIndex: event.pageIndex, pageSize: event.pageSize });
  }

  /** Clears every filter. */
  protected clearFilters(): void {
    this.searchText.set('');
    this.change({ text: '', kind: null, level: null, under: null, archived: 'false' });
  }

  /** Opens a series' page. */
  protected open(series: SeriesSummary): void {
    void this.router.navigate(['/series', series.id]);
  }

  /** Opens the form to add a series. */
  protected addSeries(): void {
    this.openForm(null);
  }

  /** Opens the form to change a series. */
  protected editSeries(series: SeriesSummary): void {
    this.openForm(series);
  }

  /** Asks, then archives a series (or brings an archived one back). */
  protected setArchived(series: SeriesSummary, archive: boolean): void {
    const ask = archive
      ? confirmAction(this.dialog, {
          title: `Archive ${series.key}?`,
          consequence: `${series.name} leaves the catalogue's default view and is no longer refit. Its readings, fits and forecasts stay; it can be restored.`,
          confirmLabel: 'Archive',
          destructive: true,
        })
      : of(true);
    ask
      .pipe(
        filter(Boolean),
        switchMap(() => (archive ? this.client.archive(series.id) : this.client.restore(series.id))),
      )
      .subscribe({
        next: (saved) => this.done(`${saved.key} is ${archive ? 'archived' : 'restored'}.`),
        error: (error: unknown) => this.fail(error),
      });
  }

  /** Opens the add/edit dialog and reloads the page after a save. */
  private openForm(series: SeriesSummary | null): void {
    const system = this.network().find((node) => node.level === 'system');
    const defaultTimeZone =
      this.page()?.items.find((s) => s.id === system?.id)?.timeZone ??
      this.page()?.items[0]?.timeZone ??
      Intl.DateTimeFormat().resolvedOptions().timeZone;
    this.dialog
      .open<SeriesFormDialog, SeriesDialogData, SeriesDetail>(SeriesFormDialog, {
        data: { series, network: this.network(), stations: this.stations(), defaultTimeZone },
        width: '720px',
        maxWidth: '96vw',
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .pipe(filter((saved): saved is SeriesDetail => !!saved))
      .subscribe((saved) => {
        this.done(series ? `${saved.key} is saved.` : `${saved.key} is added to the catalogue.`);
        this.loadNetwork();
      });
  }

  /** Shows what an action did and reads the page again. */
  private done(message: string): void {
    this.problem.set(null);
    this.outcome.set(message);
    this.reload.next();
  }

  /** Shows why an action failed. */
  private fail(error: unknown): void {
    this.outcome.set(null);
    this.problem.set(problemMessage(error));
  }
}
