import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ApplySettingsTrialResult, ModelSettingsRequest, SettingsTrial, SettingsTrialList } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The settings-trial APIs. Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class SettingsTrialsClient {
  private readonly http = inject(HttpClient);

  /** A series' trials, newest first. */
  list(seriesId: number): Observable<SettingsTrialList> {
    return this.http.get<SettingsTrialList>(`/api/series/${seriesId}/settings-trials`);
  }

  /** Starts a trial of `proposed` against the settings in force (planners, admins). */
  start(seriesId: number, proposed: ModelSettingsRequest): Observable<SettingsTrial> {
    return this.http.post<SettingsTrial>(`/api/series/${seriesId}/settings-trials`, proposed);
  }

  /** Saves a finished trial's proposal as the series' settings and queues a refit with them. */
  apply(trialId: number): Observable<ApplySettingsTrialResult> {
    return this.http.post<ApplySettingsTrialResult>(`/api/settings-trials/${trialId}/apply`, { refit: true });
  }
}
