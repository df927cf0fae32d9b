import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  ReadingHistory,
  TemperatureForecastFile,
  TemperatureForecastFileResult,
  TemperatureForecastHours,
  TemperatureForecastIssueList,
  UploadReceipt,
} from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The APIs behind a weather station's forecasts. Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class StationClient {
  private readonly http = inject(HttpClient);

  /** The station's forecast issues, newest first, with where each came from. */
  issues(stationId: number): Observable<TemperatureForecastIssueList> {
    return this.http.get<TemperatureForecastIssueList>(`/api/series/${stationId}/temperature-forecasts`);
  }

  /** The valid hours of one issue. */
  hours(stationId: number, issuedAt: string): Observable<TemperatureForecastHours> {
    return this.http.get<TemperatureForecastHours>(`/api/series/${stationId}/temperature-forecast-hours`, { params: { issuedAt } });
  }

  /** Observed temperatures between two instants. */
  observed(stationId: number, from: string, to: string): Observable<ReadingHistory> {
    return this.http.get<ReadingHistory>(`/api/series/${stationId}/readings`, { params: { from, to } });
  }

  /** Sends a CSV file; it is stored and previewed, awaiting how to read it. */
  send(file: File): Observable<UploadReceipt> {
    const body = new FormData();
    body.append('file', file, file.name);
    return this.http.post<UploadReceipt>('/api/uploads', body);
  }

  /** Reads a received file as forecast issues: checked only, or stored all or nothing. */
  readForecast(uploadId: number, request: TemperatureForecastFile): Observable<TemperatureForecastFileResult> {
    return this.http.post<TemperatureForecastFileResult>(`/api/uploads/${uploadId}/temperature-forecast`, request);
  }

  /** Discards a received file that will not be stored. */
  discard(uploadId: number): Observable<void> {
    return this.http.delete<void>(`/api/uploads/${uploadId}`);
  }
}
