/** @loadwright/series: the public surface of the library. */
export * from './series-repository';
export * from './series-service';
