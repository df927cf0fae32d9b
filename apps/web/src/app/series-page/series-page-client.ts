import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  ApprovalPreview,
  AssumedTemperatures,
  ApprovalResult,
  CreateAdjustmentRequest,
  FitSummary,
  ForecastAdjustment,
  HierarchyCoherence,
  ReconcileRequest,
  ReconciliationResult,
  ForecastReview,
  ForecastVersionPage,
  ModelSettings,
  ModelSettingsRequest,
  ReadingHistory,
  SeriesDetail,
} from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The APIs behind one series' page. Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class SeriesPageClient {
  private readonly http = inject(HttpClient);

  /** The series with its place in the hierarchy. */
  series(id: number): Observable<SeriesDetail> {
    return this.http.get<SeriesDetail>(`/api/series/${id}`);
  }

  /** Readings between `from` and `to` (ISO), aggregated by the API over long ranges. */
  readings(id: number, from: string | null, to: string | null): Observable<ReadingHistory> {
    const params: Record<string, string> = {};
    if (from) params['from'] = from;
    if (to) params['to'] = to;
    return this.http.get<ReadingHistory>(`/api/series/${id}/readings`, { params });
  }

  /** Draft, approved, actuals so far and their comparison. */
  forecast(id: number): Observable<ForecastReview> {
    return this.http.get<ForecastReview>(`/api/series/${id}/forecast`);
  }

  /** Version history, newest first. */
  versions(id: number): Observable<ForecastVersionPage> {
    return this.http.get<ForecastVersionPage>(`/api/series/${id}/forecast-versions`, { params: { limit: 20 } });
  }

  /** The newest fit: coefficients, diagnostics and what auto compared. */
  fit(id: number): Observable<FitSummary> {
    return this.http.get<FitSummary>(`/api/series/${id}/fit`);
  }

  /** The series' model settings. */
  modelSettings(id: number): Observable<ModelSettings> {
    return this.http.get<ModelSettings>(`/api/series/${id}/model`);
  }

  /** Replaces the model settings (planners, admins). */
  saveModelSettings(id: number, settings: ModelSettingsRequest): Observable<ModelSettings> {
    return this.http.put<ModelSettings>(`/api/series/${id}/model`, settings);
  }

  /** Adjusts a period of a draft. */
  addAdjustment(versionId: number, request: CreateAdjustmentRequest): Observable<ForecastAdjustment> {
    return this.http.post<ForecastAdjustment>(`/api/forecast-versions/${versionId}/adjustments`, request);
  }

  /** Removes an adjustment from a draft. */
  removeAdjustment(versionId: number, adjustmentId: number): Observable<void> {
    return this.http.delete<void>(`/api/forecast-versions/${versionId}/adjustments/${adjustmentId}`);
  }

  /** What approving every draft of a group (a series and all below it) would change. */
  previewApproval(parentId: number): Observable<ApprovalPreview> {
    return this.http.post<ApprovalPreview>('/api/forecast-approvals/preview', { parentId });
  }

  /** Approves these drafts together, all or none; stale drafts only with `includeStale`. */
  approveMany(versionIds: readonly number[], includeStale = false): Observable<ApprovalResult> {
    return this.http.post<ApprovalResult>('/api/forecast-approvals', { versionIds, includeStale });
  }

  /** Approves a draft; the previously approved version is superseded. */
  approve(versionId: number): Observable<ApprovalResult> {
    return this.http.post<ApprovalResult>(`/api/forecast-versions/${versionId}/approve`, null);
  }

  /** A parent's forecast against the sum of its children, hour by hour (drafts or approved versions). */
  coherence(parentId: number, state: 'draft' | 'approved'): Observable<HierarchyCoherence> {
    return this.http.get<HierarchyCoherence>(`/api/series/${parentId}/coherence`, { params: { state } });
  }

  /** Reconciles the drafts of a series and everything below it into one coherent set. */
  reconcile(parentId: number, request: ReconcileRequest): Observable<ReconciliationResult> {
    return this.http.post<ReconciliationResult>(`/api/series/${parentId}/reconciliations`, request);
  }

  /** The temperatures the current forecast assumed (observed, then the forecast issue its fit used). */
  assumedTemperatures(id: number): Observable<AssumedTemperatures> {
    return this.http.get<AssumedTemperatures>(`/api/series/${id}/assumed-temperatures`);
  }
}
