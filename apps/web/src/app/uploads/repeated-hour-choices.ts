import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatRadioModule } from '@angular/material/radio';
import { repeatedHourChoiceKinds, type RepeatedHourChoiceKind, type RepeatedHourQuestion, type UploadDetail } from '@loadwright/contracts';
import { problemMessage } from '../core/problems/api-problem';
import { choiceWords, reasonWords } from './repeated-hour-labels';
import { UploadsClient } from './uploads-client';

/** A question's key in the choices signal. */
const keyOf = (question: RepeatedHourQuestion) => `${question.seriesKey} ${question.local}`;

/**
 * The repeated daylight-saving hours an import stopped to ask about, each with the readings the file
 * holds at that time and the three readings of it (first is daylight time, second is daylight time,
 * drop); sending the choices resumes the import. Nothing is stored until then.
 */
@Component({
  selector: 'lw-repeated-hour-choices',
  imports: [DecimalPipe, FormsModule, MatButtonModule, MatIconModule, MatRadioModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './repeated-hour-choices.html',
  styleUrl: './repeated-hour-choices.scss',
})
export class RepeatedHourChoices {
  private readonly client = inject(UploadsClient);

  /** The upload awaiting the choices. */
  readonly detail = input.required<UploadDetail>();
  /** Emitted once the choices are accepted and the import is queued again. */
  readonly answered = output();

  protected readonly kinds = repeatedHourChoiceKinds;
  protected readonly reasonWords = reasonWords;
  protected readonly choiceWords = choiceWords;
  protected readonly keyOf = keyOf;
  /** The choice per question key. */
  protected readonly choices = signal<ReadonlyMap<string, RepeatedHourChoiceKind>>(new Map());
  protected readonly sending = signal(false);
  protected readonly problem = signal<string | null>(null);

  protected readonly questions = computed(() => this.detail().repeatedHours);
  protected readonly open = computed(() => this.questions().filter((question) => !this.choices().has(keyOf(question))).length);

  /** Sets one hour's choice. */
  protected choose(question: RepeatedHourQuestion, choice: RepeatedHourChoiceKind): void {
    this.choices.update((current) => new Map(current).set(keyOf(question), choice));
  }

  /** Sets the same choice for every hour (for a file with many). */
  protected chooseAll(choice: RepeatedHourChoiceKind): void {
    this.choices.set(new Map(this.questions().map((question) => [keyOf(question), choice])));
  }

  /** Sends the choices; the import resumes. */
  protected resumeImport(): void {
    const choices = this.questions().map((question) => ({
      seriesKey: question.seriesKey,
      local: question.local,
      choice: this.choices().get(keyOf(question))!,
    }));
    this.sending.set(true);
    this.problem.set(null);
    this.client.chooseRepeatedHours(this.detail().upload.id, choices).subscribe({
      next: () => {
        this.sending.set(false);
        this.answered.emit();
      },
      error: (error: unknown) => {
        this.sending.set(false);
        this.problem.set(problemMessage(error));
      },
    });
  }
}
