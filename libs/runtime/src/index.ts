/** @loadwright/runtime: the public surface of the library. */
export * from './config';
export * from './exit-with-parent';
export * from './loggable-error';
