/** @loadwright/audit: the public surface of the library. */
export * from './actor';
export * from './audit-log';
export * from './target-names';
