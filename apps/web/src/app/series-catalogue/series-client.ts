import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CreateSeriesRequest, SeriesDetail, SeriesPage, UpdateSeriesRequest } from '@loadwright/contracts';
import type { Observable } from 'rxjs';
import { type CatalogueQuery, catalogueParams } from './catalogue-query';

/** The series catalogue API. Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class SeriesClient {
  private readonly http = inject(HttpClient);

  /** One page of the catalogue for the filters, sort and paging given. */
  list(query: CatalogueQuery): Observable<SeriesPage> {
    return this.http.get<SeriesPage>('/api/series', { params: new HttpParams({ fromObject: catalogueParams(query) }) });
  }

  /** One series with its place in the hierarchy and reading counts by quality flag. */
  get(id: number | string): Observable<SeriesDetail> {
    return this.http.get<SeriesDetail>(`/api/series/${encodeURIComponent(String(id))}`);
  }

  /** Adds a series (stewards, admins). */
  create(request: CreateSeriesRequest): Observable<SeriesDetail> {
    return this.http.post<SeriesDetail>('/api/series', request);
  }

  /** Changes a series; unit and interval are fixed once readings are stored. */
  update(id: number, change: UpdateSeriesRequest): Observable<SeriesDetail> {
    return this.http.patch<SeriesDetail>(`/api/series/${id}`, change);
  }

  /** Archives a series: hidden by default and never refit. */
  archive(id: number): Observable<SeriesDetail> {
    return this.http.post<SeriesDetail>(`/api/series/${id}/archive`, null);
  }

  /** Brings an archived series back. */
  restore(id: number): Observable<SeriesDetail> {
    return this.http.post<SeriesDetail>(`/api/series/${id}/restore`, null);
  }
}
