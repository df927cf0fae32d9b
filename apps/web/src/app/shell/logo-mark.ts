import { ChangeDetectionStrategy, Component, input } from '@angular/core';

/**
 * Loadwright's mark: a day's load curve rising to its peak (the amber point) over a baseline.
 * Decorative by default; the wordmark beside it carries the name.
 */
@Component({
  selector: 'lw-logo-mark',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '[style.width.px]': 'size()', '[style.height.px]': 'size()' },
  template: `
    <svg viewBox="0 0 32 32" width="100%" height="100%" aria-hidden="true" focusable="false">
      <rect width="32" height="32" rx="7" class="tile" />
      <path d="M6 22.5h20" class="baseline" />
      <path d="M6 19l5-6 4 3.5 5-8 6 6.5" class="curve" />
      <circle cx="20" cy="8.5" r="2.2" class="peak" />
    </svg>
  `,
  styles: `
    :host {
      display: inline-block;
      flex: none;
    }
    svg {
      display: block;
    }
    .tile {
      fill: var(--mat-sys-primary);
    }
    .baseline {
      stroke: var(--mat-sys-primary-fixed);
      stroke-width: 2;
      stroke-linecap: round;
    }
    .curve {
      fill: none;
      stroke: var(--mat-sys-on-primary);
      stroke-width: 2.6;
      stroke-linecap: round;
      stroke-linejoin: round;
    }
    .peak {
      fill: var(--mat-sys-tertiary-fixed-dim);
    }
  `,
})
export class LogoMark {
  /** Edge length in CSS pixels. */
  readonly size = input(32);
}
