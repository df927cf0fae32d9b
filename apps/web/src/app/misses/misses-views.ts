import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { RouterLink } from '@angular/router';

/** The two views of the Misses section: the misses themselves and the rules that find them. */
@Component({
  selector: 'lw-misses-views',
  imports: [RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <nav class="views" aria-label="Misses views">
      <a routerLink="/misses" [class.active]="current() === 'misses'" [attr.aria-current]="current() === 'misses' ? 'page' : null"
        >Misses</a
      >
      <a routerLink="/misses/rules" [class.active]="current() === 'rules'" [attr.aria-current]="current() === 'rules' ? 'page' : null"
        >Rules</a
      >
    </nav>
  `,
  styles: `
    .views {
      display: flex;
      gap: 4px;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
    }

    a {
      padding: 8px 16px;
      color: var(--mat-sys-on-surface-variant);
      text-decoration: none;
      font: var(--mat-sys-title-small);
      border-bottom: 3px solid transparent;

      &:hover {
        color: var(--mat-sys-on-surface);
      }

      &.active {
        color: var(--mat-sys-primary);
        border-bottom-color: var(--mat-sys-primary);
      }
    }
  `,
})
export class MissesViews {
  /** The view shown now. */
  readonly current = input.required<'misses' | 'rules'>();
}
