import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** Shown for an address no section answers to. */
@Component({
  selector: 'lw-not-found',
  imports: [MatButtonModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h1>Page not found</h1>
    <p>There is no Loadwright page at this address. It may have moved, or the link may be mistyped.</p>
    <a mat-stroked-button routerLink="/overview">Go to the Overview</a>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      align-items: flex-start;
      gap: 16px;
      max-width: 720px;
    }
    h1 {
      font: var(--mat-sys-headline-medium);
      font-weight: 600;
    }
    p {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class NotFound {}
