/** @loadwright/readings: the public surface of the library. */
export * from './green-button/green-button-readings';
export * from './green-button/parse-green-button';
export * from './history-service';
export * from './import-service';
export * from './push-readings';
export * from './temperature-forecast-issues';
export * from './green-button/read-green-button-off-thread';
export * from './temperature-forecast-upload';
