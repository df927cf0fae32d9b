import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { SessionStore } from '../../core/auth/session-store';
import type { ProductSection } from '../../core/product-sections';

/** Shown at a section's address to someone whose role may not open it: says so, and offers a way back. */
@Component({
  selector: 'lw-refused',
  imports: [MatButtonModule, MatIconModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h1>
      <mat-icon aria-hidden="true" svgIcon="block"></mat-icon>
      Not allowed for your role
    </h1>
    <p class="notice" role="alert">{{ explanation() }}</p>
    <a mat-stroked-button routerLink="/overview">Go to the Overview</a>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      align-items: flex-start;
      gap: 20px;
      max-width: 720px;
    }
    h1 {
      display: flex;
      align-items: center;
      gap: 12px;
      font: var(--mat-sys-headline-medium);
      font-weight: 600;
    }
    h1 mat-icon {
      color: var(--mat-sys-error);
    }
    .notice {
      margin: 0;
      padding: 16px 20px;
      border-radius: var(--mat-sys-corner-large);
      background: var(--mat-sys-surface-container);
      font: var(--mat-sys-body-large);
    }
  `,
})
export class Refused {
  private readonly session = inject(SessionStore);

  /** The section whose address was opened; bound from the route's data. */
  readonly section = input.required<ProductSection>();

  /** One sentence naming the section and the role, and who can help. */
  protected readonly explanation = computed(() => {
    const role = this.session.user()?.role ?? 'current';
    return `${this.section().label} is not available to your role (${role}). If you need it for your work, ask an admin of your Loadwright to change your role.`;
  });
}
