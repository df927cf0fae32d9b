/** @loadwright/problems: the public surface of the library. */
export * from './http-problem';
