import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { ProductSection } from '../../core/product-sections';

/** The page of a section not built yet: its name, one honest line on what it will do, and a way back. */
@Component({
  selector: 'lw-upcoming-section',
  imports: [MatButtonModule, MatIconModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './upcoming-section.html',
  styleUrl: './upcoming-section.scss',
})
export class UpcomingSection {
  /** The section this page stands in for; bound from the route's data. */
  readonly section = input.required<ProductSection>();
}
