import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, input, viewChild } from '@angular/core';
import { DomSanitizer } from '@angular/platform-browser';

/**
 * Shows a message's HTML part as its recipient would see it, in a sandboxed frame that runs no scripts.
 *
 * The frame, not Angular's HTML sanitiser, is what makes the markup harmless: the sanitiser would strip
 * the style attributes e-mail relies on, so the markup is passed through as trusted for the frame only.
 * The app's Content-Security-Policy (inherited by a srcdoc frame) refuses style attributes written in
 * markup, and e-mail HTML styles itself with exactly those. So once the frame has loaded, each
 * element's style attribute is applied again through the CSSOM, which the policy does not govern.
 * That needs `allow-same-origin` so this page may reach into the frame; without `allow-scripts` the
 * message itself still cannot run anything, open windows, submit forms or navigate the page.
 */
@Component({
  selector: 'lw-mail-frame',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<iframe
    #frame
    class="html"
    sandbox="allow-same-origin"
    [srcdoc]="trustedHtml()"
    [title]="title()"
    (load)="applyInlineStyles()"
  ></iframe>`,
  styles: `
    :host {
      display: block;
    }
    iframe {
      display: block;
      width: 100%;
      height: 420px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-small);
      background: #fff;
    }
  `,
})
export class MailFrame {
  /** The HTML part, exactly as received. */
  readonly html = input.required<string>();
  /** Accessible name of the frame. */
  readonly title = input.required<string>();

  /** The frame element, to reach its document once loaded. */
  private readonly frame = viewChild.required<ElementRef<HTMLIFrameElement>>('frame');
  private readonly sanitizer = inject(DomSanitizer);

  /** The markup, trusted only because the sandbox lets it run nothing (see the class comment). */
  protected readonly trustedHtml = computed(() => this.sanitizer.bypassSecurityTrustHtml(this.html()));

  /** Re-applies the message's inline styles through the CSSOM (see the class comment for why). */
  protected applyInlineStyles(): void {
    const document = this.frame().nativeElement.contentDocument;
    if (!document) return;
    for (const element of Array.from(document.querySelectorAll<HTMLElement>('[style]'))) {
      element.style.cssText = element.getAttribute('style') ?? '';
    }
  }
}
