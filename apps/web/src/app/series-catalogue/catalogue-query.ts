import {
  type SeriesKind,
  type SeriesLevel,
  type SeriesSortKey,
  archivedFilters,
  seriesKinds,
  seriesLevels,
  seriesSortKeys,
} from '@loadwright/contracts';

/** What the catalogue table asks for: the filters, the sort and the page, as the page holds them. */
export interface CatalogueQuery {
  /** Text searched in key and name; blank for none. */
  readonly text: string;
  readonly kind: SeriesKind | null;
  readonly level: SeriesLevel | null;
  /** Key of the series whose whole subtree is listed (e.g. a zone and its feeders); null for the whole catalogue. */
  readonly under: string | null;
  readonly archived: (typeof archivedFilters)[number];
  readonly sort: SeriesSortKey;
  readonly order: 'asc' | 'desc';
  /** Zero-based page number. */
  readonly pageIndex: number;
  readonly pageSize: number;
}

/** The catalogue as it opens: live series by key, first page of 25. */
export const initialCatalogueQuery: CatalogueQuery = {
  text: '',
  kind: null,
  level: null,
  under: null,
  archived: 'false',
  sort: 'key',
  order: 'asc',
  pageIndex: 0,
  pageSize: 25,
};

/** Query-string parameters of GET /api/series for a catalogue query; empty filters are left out. */
export function catalogueParams(query: CatalogueQuery): Record<string, string> {
  const params: Record<string, string> = {
    archived: query.archived,
    sort: query.sort,
    order: query.order,
    offset: String(query.pageIndex * query.pageSize),
    limit: String(query.pageSize),
  };
  const text = query.text.trim();
  if (text) params['q'] = text;
  if (query.kind) params['kind'] = query.kind;
  if (query.level) params['level'] = query.level;
  if (query.under) {
    params['parent'] = query.under;
    params['descendants'] = 'true';
  }
  return params;
}

/** The address bar's form of a query (only what differs from the opening state), so a filtered view can be shared. */
export function queryToUrl(query: CatalogueQuery): Record<string, string | null> {
  const differs = <K extends keyof CatalogueQuery>(key: K) => query[key] !== initialCatalogueQuery[key];
  return {
    q: query.text.trim() || null,
    kind: query.kind,
    level: query.level,
    under: query.under,
    archived: differs('archived') ? query.archived : null,
    sort: differs('sort') ? query.sort : null,
    order: differs('order') ? query.order : null,
    page: query.pageIndex > 0 ? String(query.pageIndex + 1) : null,
    size: differs('pageSize') ? String(query.pageSize) : null,
  };
}

/** Reads a query back from the address bar; anything unknown falls back to the opening state. */
export function queryFromUrl(params: { get(name: string): string | null }): CatalogueQuery {
  const oneOf = <T extends string>(value: string | null, allowed: readonly T[]): T | null =>
    allowed.includes(value as T) ? (value as T) : null;
  const page = Number(params.get('page'));
  const size = Number(params.get('size'));
  return {
    ...initialCatalogueQuery,
    text: params.get('q') ?? '',
    kind: oneOf(params.get('kind'), seriesKinds),
    level: oneOf(params.get('level'), seriesLevels),
    under: params.get('under') || null,
    archived: oneOf(params.get('archived'), archivedFilters) ?? initialCatalogueQuery.archived,
    sort: oneOf(params.get('sort'), seriesSortKeys) ?? initialCatalogueQuery.sort,
    order: oneOf(params.get('order'), ['asc', 'desc'] as const) ?? initialCatalogueQuery.order,
    pageIndex: Number.isInteger(page) && page > 1 ? page - 1 : 0,
    // The API serves at most 200 rows a page.
    pageSize: Number.isInteger(size) && size >= 1 && size <= 200 ? size : initialCatalogueQuery.pageSize,
  };
}
