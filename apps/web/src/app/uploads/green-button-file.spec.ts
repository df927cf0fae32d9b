import { describe, expect, it } from 'vitest';
import { isXmlFile } from './green-button-file';

describe('isXmlFile', () => {
  it('sees XML by the name or the type the browser gives', () => {
    expect(isXmlFile({ name: 'pump-house.XML', type: '' })).toBe(true);
    expect(isXmlFile({ name: 'usage', type: 'application/atom+xml' })).toBe(true);
    expect(isXmlFile({ name: 'usage', type: 'text/xml' })).toBe(true);
  });

  it('leaves CSV files to the CSV upload', () => {
    expect(isXmlFile({ name: 'Zähler-Süd.csv', type: 'text/csv' })).toBe(false);
    expect(isXmlFile({ name: 'xml-export.csv', type: '' })).toBe(false);
  });
});
