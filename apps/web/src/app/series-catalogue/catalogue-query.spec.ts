import { describe, expect, it } from 'vitest';
import { catalogueParams, initialCatalogueQuery, queryFromUrl, queryToUrl } from './catalogue-query';

const fromRecord = (record: Record<string, string | null>) => ({ get: (name: string) => record[name] ?? null });

describe('catalogueParams', () => {
  it('asks for live series by key, first page, with no empty filters', () => {
    expect(catalogueParams(initialCatalogueQuery)).toEqual({ archived: 'false', sort: 'key', order: 'asc', offset: '0', limit: '25' });
  });

  it('lists a whole subtree for a hierarchy filter and pages by offset', () => {
    const params = catalogueParams({
      ...initialCatalogueQuery,
      under: 'zone-north',
      level: 'feeder',
      text: '  harrow ',
      pageIndex: 2,
      pageSize: 10,
    });
    expect(params).toMatchObject({ parent: 'zone-north', descendants: 'true', level: 'feeder', q: 'harrow', offset: '20', limit: '10' });
  });
});

describe('address bar round trip', () => {
  it('keeps only what differs from the opening state and reads it back', () => {
    const query = {
      ...initialCatalogueQuery,
      under: 'zone-south',
      kind: 'load' as const,
      sort: 'name' as const,
      order: 'desc' as const,
      pageIndex: 1,
      pageSize: 10,
    };
    const url = queryToUrl(query);
    expect(url).toEqual({
      q: null,
      kind: 'load',
      level: null,
      under: 'zone-south',
      archived: null,
      sort: 'name',
      order: 'desc',
      page: '2',
      size: '10',
    });
    expect(queryFromUrl(fromRecord(url))).toEqual(query);
  });

  it('falls back to the opening state for values it does not know', () => {
    expect(queryFromUrl(fromRecord({ kind: 'gas', sort: 'colour', archived: 'maybe', page: '-3', size: '500' }))).toEqual(
      initialCatalogueQuery,
    );
  });
});
