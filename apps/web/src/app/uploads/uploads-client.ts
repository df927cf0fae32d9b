import { HttpClient, type HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ConfirmUploadRequest, Upload, UploadDetail, UploadPage, UploadReceipt } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The uploads API (stewards and admins). Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class UploadsClient {
  private readonly http = inject(HttpClient);

  /** The newest uploads first. */
  list(limit = 20): Observable<UploadPage> {
    return this.http.get<UploadPage>('/api/uploads', { params: { limit } });
  }

  /** One upload: status, progress, counts and report; while awaiting its mapping also preview and proposal. */
  get(id: number): Observable<UploadDetail> {
    return this.http.get<UploadDetail>(`/api/uploads/${id}`);
  }

  /** Sends a file as multipart/form-data, reporting the transfer's progress as it goes. */
  send(file: File): Observable<HttpEvent<UploadReceipt>> {
    const body = new FormData();
    body.append('file', file, file.name);
    return this.http.post<UploadReceipt>('/api/uploads', body, { reportProgress: true, observe: 'events' });
  }

  /** Confirms the mapping and settings; the import job is queued. */
  confirm(id: number, request: ConfirmUploadRequest): Observable<Upload> {
    return this.http.post<Upload>(`/api/uploads/${id}/mapping`, request);
  }

  /** Address of the findings CSV, for a download link. */
  reportCsvUrl(id: number): string {
    return `/api/uploads/${id}/report.csv`;
  }
}
