/** @loadwright/audit: the public surface of the library. */
export * from './actor';
export * from './audit-log';
export * from './repeat-damper';
export * from './target-names';
