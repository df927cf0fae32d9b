import { BreakpointObserver } from '@angular/cdk/layout';
import { NgTemplateOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, signal, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive } from '@angular/router';
import { map } from 'rxjs';
import { SessionStore } from '../core/auth/session-store';
import { PRODUCT_SECTIONS, SECTION_GROUP_LABELS } from '../core/product-sections';
import { Cautions } from './cautions';
import { LogoMark } from './logo-mark';

/** Wide enough to keep the navigation open beside the content. */
const WIDE_LAYOUT = '(min-width: 960px)';

/** The frame of every page: top bar, section navigation (beside or over the content), main area, cautions. */
@Component({
  selector: 'lw-shell',
  imports: [
    NgTemplateOutlet,
    MatSidenavModule,
    MatToolbarModule,
    MatIconModule,
    MatButtonModule,
    RouterLink,
    RouterLinkActive,
    LogoMark,
    Cautions,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
})
export class Shell {
  private readonly breakpoints = inject(BreakpointObserver);
  private readonly main = viewChild.required<ElementRef<HTMLElement>>('main');
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);

  /** True on wide screens, where the navigation stays open beside the content. */
  protected readonly wide = toSignal(this.breakpoints.observe(WIDE_LAYOUT).pipe(map((state) => state.matches)), {
    initialValue: this.breakpoints.isMatched(WIDE_LAYOUT),
  });
  /** Whether the narrow-screen menu is open. */
  protected readonly menuOpen = signal(false);
  /** The signed-in person, or null on the sign-in and set-password pages. */
  protected readonly user = this.session.user;
  /** The navigation is always shown on wide screens and on demand on narrow ones. */
  protected readonly navigationOpen = computed(() => this.wide() || this.menuOpen());
  /** Sections the signed-in person may open: the navigation hides the rest (the API still decides). */
  private readonly permittedSections = computed(() =>
    PRODUCT_SECTIONS.filter((section) => this.session.permissions().has(section.permission)),
  );
  /** Everyday work sections. */
  protected readonly workSections = computed(() => this.permittedSections().filter((section) => section.group === 'work'));
  /** Sections grouped under a heading ("People and settings", "Development"), empty groups left out. */
  protected readonly sectionGroups = computed(() =>
    (Object.keys(SECTION_GROUP_LABELS) as (keyof typeof SECTION_GROUP_LABELS)[])
      .map((group) => ({
        id: group,
        label: SECTION_GROUP_LABELS[group],
        sections: this.permittedSections().filter((section) => section.group === group),
      }))
      .filter((group) => group.sections.length > 0),
  );

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

  /** Ends the session on the server and returns to the sign-in page. */
  protected async signOut(): Promise<void> {
    this.closeMenu();
    await this.session.signOut();
    await this.router.navigate(['/sign-in']);
  }

  /** Moves keyboard focus to the main content; the skip link's target for keyboard users. */
  protected skipToContent(event: Event): void {
    event.preventDefault();
    this.main().nativeElement.focus();
  }
}
