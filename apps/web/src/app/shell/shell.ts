import { BreakpointObserver } from '@angular/cdk/layout';
import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, signal, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { RouterLink, RouterLinkActive } from '@angular/router';
import { map } from 'rxjs';
import { PRODUCT_SECTIONS } from '../core/product-sections';
import { Cautions } from './cautions';
import { LogoMark } from './logo-mark';

/** Wide enough to keep the navigation open beside the content. */
const WIDE_LAYOUT = '(min-width: 960px)';

/** The frame of every page: top bar, section navigation (beside or over the content), main area, cautions. */
@Component({
  selector: 'lw-shell',
  imports: [MatSidenavModule, MatToolbarModule, MatListModule, MatIconModule, MatButtonModule, RouterLink, RouterLinkActive, LogoMark, Cautions],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
})
export class Shell {
  private readonly breakpoints = inject(BreakpointObserver);
  private readonly main = viewChild.required<ElementRef<HTMLElement>>('main');

  /** True on wide screens, where the navigation stays open beside the content. */
  protected readonly wide = toSignal(this.breakpoints.observe(WIDE_LAYOUT).pipe(map((state) => state.matches)), {
    initialValue: this.breakpoints.isMatched(WIDE_LAYOUT),
  });
  /** Whether the narrow-screen menu is open. */
  protected readonly menuOpen = signal(false);
  /** The navigation is always shown on wide screens and on demand on narrow ones. */
  protected readonly navigationOpen = computed(() => this.wide() || this.menuOpen());
  /** Sections that can be used today. */
  protected readonly availableSections = PRODUCT_SECTIONS.filter((section) => section.available);
  /** Sections listed so people know they are coming, each with an honest placeholder page. */
  protected readonly upcomingSections = PRODUCT_SECTIONS.filter((section) => !section.available);

  /** Opens or closes the narrow-screen menu. */
  protected toggleMenu(): void {
    this.menuOpen.update((open) => !open);
  }

  /** Keeps the menu state in step when the drawer closes itself (backdrop click, Escape). */
  protected syncMenu(open: boolean): void {
    if (!this.wide()) this.menuOpen.set(open);
  }

  /** Closes the narrow-screen menu after a section is chosen. */
  protected closeMenu(): void {
    this.menuOpen.set(false);
  }

  /** Moves keyboard focus to the main content; the skip link's target for keyboard users. */
  protected skipToContent(event: Event): void {
    event.preventDefault();
    this.main().nativeElement.focus();
  }
}
