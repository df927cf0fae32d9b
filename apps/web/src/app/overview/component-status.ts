import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { ComponentLine } from './health-reading';

/** One service component's card: name, state in words with an icon, detail and round-trip time. */
@Component({
  selector: 'lw-component-status',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[class.problem]': '!line().ok' },
  template: `
    <div class="heading">
      <mat-icon aria-hidden="true" [svgIcon]="icon()"></mat-icon>
      <h3>{{ title() }}</h3>
    </div>
    <p class="state">
      <mat-icon class="state-icon" aria-hidden="true" [svgIcon]="line().icon"></mat-icon>
      <strong>{{ line().text }}</strong>
    </p>
    <p class="detail">{{ line().detail }}</p>
    @if (line().latency; as latency) {
      <p class="latency">Answered in {{ latency }}</p>
    }
    <ng-content />
  `,
  styleUrl: './component-status.scss',
})
export class ComponentStatus {
  /** Heading of the card, e.g. "Database". */
  readonly title = input.required<string>();
  /** Material Symbols ligature drawn beside the heading. */
  readonly icon = input.required<string>();
  /** The component's state as the Overview describes it. */
  readonly line = input.required<ComponentLine>();
}
