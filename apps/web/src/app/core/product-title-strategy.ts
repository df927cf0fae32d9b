import { Injectable, inject } from '@angular/core';
import { Title } from '@angular/platform-browser';
import { RouterStateSnapshot, TitleStrategy } from '@angular/router';

/** Sets the document title to "<page> · Loadwright", so tabs and screen readers name the page. */
@Injectable()
export class ProductTitleStrategy extends TitleStrategy {
  private readonly title = inject(Title);

  /** Called by the router after each navigation with the new router state. */
  override updateTitle(snapshot: RouterStateSnapshot): void {
    const page = this.buildTitle(snapshot);
    this.title.setTitle(page ? `${page} · Loadwright` : 'Loadwright');
  }
}
