import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { SeriesDetail, TemperatureForecastFileResult, UploadReceipt } from '@loadwright/contracts';
import { problemMessage } from '../core/problems/api-problem';
import { zonedClock } from '../series-page/zoned-time';
import { guessForecastColumns } from './forecast-columns';
import { StationClient } from './station-client';

/** How the steward says the file is to be read. */
interface ForecastReading {
  issuedAtColumn: string;
  validTimeColumn: string;
  valueColumn: string;
  unit: 'degC' | 'degF';
  timeZone: string;
}

/**
 * Uploading a file of forecast issues for a station: send the file, see its first rows, say which columns hold
 * the issue time, the valid hour and the temperature (and the unit), check what it would store and what stops
 * it, then store every issue at once. Nothing is stored until the steward stores a file that checks clean.
 */
@Component({
  selector: 'lw-forecast-upload',
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './forecast-upload.html',
  styleUrl: './forecast-upload.scss',
})
export class ForecastUpload {
  private readonly client = inject(StationClient);

  /** The station the issues are for. */
  readonly station = input.required<SeriesDetail>();
  /** Emits the sentence saying what was stored. */
  readonly stored = output<string>();
  /** Emits when a new file is sent, so an earlier outcome stops showing. */
  readonly started = output<void>();

  /** The received file, awaiting how to read it. */
  protected readonly receipt = signal<UploadReceipt | null>(null);
  /** How to read it. */
  protected readonly reading = signal<ForecastReading>({
    issuedAtColumn: '',
    validTimeColumn: '',
    valueColumn: '',
    unit: 'degF',
    timeZone: '',
  });
  /** What the last check found. */
  protected readonly checked = signal<TemperatureForecastFileResult | null>(null);
  /** A sentence from the server: a repeated file, a refusal. */
  protected readonly message = signal<string | null>(null);
  protected readonly problem = signal<string | null>(null);
  /** True while a request runs. */
  protected readonly busy = signal(false);

  /** The file's columns. */
  protected readonly columns = computed(() => this.receipt()?.layout?.columns ?? []);
  /** The first rows of the file, at most six. */
  protected readonly previewRows = computed(() => (this.receipt()?.preview?.rows ?? []).slice(0, 6));
  /** Whether every choice is made. */
  protected readonly complete = computed(() => {
    const reading = this.reading();
    return !!reading.issuedAtColumn && !!reading.validTimeColumn && !!reading.valueColumn && !!reading.timeZone.trim();
  });
  /** Whether the last check found a file that can be stored as it is read now. */
  protected readonly storable = computed(() => {
    const checked = this.checked();
    return !!checked && checked.problems.length === 0 && checked.issues.length > 0;
  });

  protected readonly clock = zonedClock;

  /** Sends the chosen file; a new file is previewed, the same bytes again say which upload they were. */
  protected sendFile(event: Event): void {
    const field = event.target as HTMLInputElement;
    const file = field.files?.[0];
    field.value = '';
    if (!file) return;
    this.reset();
    this.started.emit();
    this.busy.set(true);
    this.client.send(file).subscribe({
      next: (receipt) => {
        this.busy.set(false);
        if (receipt.upload.status !== 'received') {
          this.message.set(receipt.message ?? receipt.upload.error ?? `Upload ${receipt.upload.id} is ${receipt.upload.status}.`);
          return;
        }
        // The same file sent earlier and never stored: carry on with that upload, saying so.
        if (receipt.duplicateOf !== null) this.message.set(`${receipt.message} Carrying on with it.`);
        const guess = guessForecastColumns(receipt.layout?.columns ?? []);
        this.reading.set({
          issuedAtColumn: guess.issuedAtColumn ?? '',
          validTimeColumn: guess.validTimeColumn ?? '',
          valueColumn: guess.valueColumn ?? '',
          unit: guess.unit ?? (this.station().unit === 'degC' ? 'degC' : 'degF'),
          timeZone: this.station().timeZone,
        });
        this.receipt.set(receipt);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.problem.set(problemMessage(error));
      },
    });
  }

  /** Changes one choice; an earlier check no longer applies. */
  protected set<K extends keyof ForecastReading>(key: K, value: ForecastReading[K]): void {
    this.reading.update((reading) => ({ ...reading, [key]: value }));
    this.checked.set(null);
  }

  /** Reads the whole file as the steward said and shows what it would store; stores nothing. */
  protected checkFile(): void {
    this.read(true);
  }

  /** Stores every issue of the file at once. */
  protected storeFile(): void {
    this.read(false);
  }

  /** Discards the received file. */
  protected discard(): void {
    const receipt = this.receipt();
    if (!receipt) return;
    this.busy.set(true);
    this.client.discard(receipt.upload.id).subscribe({
      next: () => {
        this.reset();
        this.message.set(`Discarded ${receipt.upload.fileName}; nothing was stored.`);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.problem.set(problemMessage(error));
      },
    });
  }

  private read(checkOnly: boolean): void {
    const receipt = this.receipt();
    if (!receipt || !this.complete()) return;
    this.busy.set(true);
    this.problem.set(null);
    this.client.readForecast(receipt.upload.id, { ...this.reading(), station: this.station().key, checkOnly }).subscribe({
      next: (result) => {
        this.busy.set(false);
        if (result.stored) {
          this.reset();
          this.stored.emit(result.message);
        } else this.checked.set(result);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.checked.set(null);
        this.problem.set(problemMessage(error));
      },
    });
  }

  private reset(): void {
    this.receipt.set(null);
    this.checked.set(null);
    this.message.set(null);
    this.problem.set(null);
    this.busy.set(false);
  }
}
