import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** The product's standing cautions, shown at the foot of every page. */
@Component({
  selector: 'lw-cautions',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <footer>
      <mat-icon aria-hidden="true" svgIcon="info"></mat-icon>
      <p>
        <strong>Forecasts are decision support.</strong>
        Operating, switching and reliability decisions follow the utility's procedures, the applicable reliability rules and local codes,
        and rest with licensed or authorised operators. Intervals assume the model holds; unusual events (storms, outages, large new loads)
        break that assumption.
      </p>
    </footer>
  `,
  styles: `
    footer {
      display: flex;
      gap: 12px;
      align-items: flex-start;
      max-width: 1040px;
      padding: 16px 0 0;
      border-top: 1px solid var(--mat-sys-outline-variant);
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
    mat-icon {
      flex: none;
      font-size: 20px;
      width: 20px;
      height: 20px;
    }
    p {
      margin: 0;
      max-width: 110ch;
    }
    strong {
      font-weight: 600;
      color: var(--mat-sys-on-surface);
    }
  `,
})
export class Cautions {}
