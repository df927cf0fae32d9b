import { HttpClient } from '@angular/common/http';
import { Injectable, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import type { Organisation } from '@loadwright/contracts';
import { catchError, of } from 'rxjs';

/**
 * The organisation's time zone, read once: screens that show times belonging to no single series
 * (refit runs, upload findings) state them in it and name it, so every screen has one stated time base.
 * Until it is read, or when it cannot be, times are shown in UTC, which is named as such.
 */
@Injectable({ providedIn: 'root' })
export class OrganisationZone {
  private readonly organisation = toSignal(
    inject(HttpClient)
      .get<Organisation>('/api/organisation')
      .pipe(catchError(() => of<Organisation>({ name: 'Loadwright', timeZone: 'UTC' }))),
  );

  /** IANA name of the zone, e.g. America/Chicago. */
  readonly timeZone = computed(() => this.organisation()?.timeZone ?? 'UTC');
}
