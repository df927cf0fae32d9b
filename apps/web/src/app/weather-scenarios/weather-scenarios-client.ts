import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { TemperatureScenarios } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The weather scenario API of a load series. Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class WeatherScenariosClient {
  private readonly http = inject(HttpClient);

  /** The current forecast re-run `shift` degrees hotter and colder, and with past years' weather of the same weeks. */
  scenarios(seriesId: number, shift: number): Observable<TemperatureScenarios> {
    return this.http.get<TemperatureScenarios>(`/api/series/${seriesId}/temperature-scenarios`, { params: { shift } });
  }
}
