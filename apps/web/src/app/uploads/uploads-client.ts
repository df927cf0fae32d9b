import {
  HttpBackend,
  HttpClient,
  type HttpEvent,
  HttpXhrBackend,
  provideHttpClient,
  withInterceptors,
  withXsrfConfiguration,
} from '@angular/common/http';
import { EnvironmentInjector, Injectable, createEnvironmentInjector, inject } from '@angular/core';
import type {
  ConfirmUploadRequest,
  GreenButtonImportResult,
  RepeatedHourChoice,
  Upload,
  UploadDetail,
  UploadPage,
  UploadReceipt,
} from '@loadwright/contracts';
import type { Observable } from 'rxjs';
import { sessionExpiryInterceptor } from '../core/auth/session-expiry-interceptor';
import { problemInterceptor } from '../core/problems/problem-interceptor';

/** The uploads API (stewards and admins). Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class UploadsClient {
  private readonly http = inject(HttpClient);
  /** Sends files: the app's HttpClient uses fetch, which cannot report how much of a request body has gone. */
  private readonly transfers = xhrHttpClient(inject(EnvironmentInjector));

  /** The newest uploads first, a page at a time. */
  list(limit = 20, offset = 0): Observable<UploadPage> {
    return this.http.get<UploadPage>('/api/uploads', { params: { limit, offset } });
  }

  /** Cancels a queued or running import; nothing from its file is stored. */
  cancel(id: number): Observable<Upload> {
    return this.http.post<Upload>(`/api/uploads/${id}/cancel`, {});
  }

  /** One upload: status, progress, counts and report; while awaiting its mapping also preview and proposal. */
  get(id: number): Observable<UploadDetail> {
    return this.http.get<UploadDetail>(`/api/uploads/${id}`);
  }

  /** Sends a file as multipart/form-data, reporting the transfer's progress as it goes. */
  send(file: File): Observable<HttpEvent<UploadReceipt>> {
    const body = new FormData();
    body.append('file', file, file.name);
    return this.transfers.post<UploadReceipt>('/api/uploads', body, { reportProgress: true, observe: 'events' });
  }

  /** Confirms the mapping and settings; the import job is queued. */
  confirm(id: number, request: ConfirmUploadRequest): Observable<Upload> {
    return this.http.post<Upload>(`/api/uploads/${id}/mapping`, request);
  }

  /** Answers the repeated daylight-saving hours an import stopped to ask about; the import resumes. */
  chooseRepeatedHours(id: number, choices: readonly RepeatedHourChoice[]): Observable<Upload> {
    return this.http.post<Upload>(`/api/uploads/${id}/repeated-hours`, { choices });
  }

  /** Imports a Green Button (ESPI) XML file into one series, validated and stored like an upload. */
  importGreenButton(seriesKey: string, file: Blob): Observable<GreenButtonImportResult> {
    return this.http.post<GreenButtonImportResult>(`/api/series/${encodeURIComponent(seriesKey)}/green-button`, file, {
      headers: { 'Content-Type': 'application/xml' },
    });
  }

  /** Address of the findings CSV, for a download link. */
  reportCsvUrl(id: number): string {
    return `/api/uploads/${id}/report.csv`;
  }
}

/**
 * An HttpClient that sends with XMLHttpRequest, whose upload events give the transfer's progress,
 * through the same CSRF header and interceptors as the app's own client (see app.config.ts).
 */
function xhrHttpClient(parent: EnvironmentInjector): HttpClient {
  const injector = createEnvironmentInjector(
    [
      provideHttpClient(
        withXsrfConfiguration({ cookieName: 'lw_csrf', headerName: 'X-CSRF-Token' }),
        withInterceptors([sessionExpiryInterceptor, problemInterceptor]),
      ),
      // Listed last so it wins over the fetch backend the parent provides.
      { provide: HttpBackend, useExisting: HttpXhrBackend },
    ],
    parent,
    'file transfers',
  );
  return injector.get(HttpClient);
}
