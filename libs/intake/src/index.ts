/** @loadwright/intake: the public surface of the library. */
export * from './cancel-upload';
export * from './csv/sniff';
export * from './findings';
export * from './import-plan';
export * from './import-queue';
export * from './import-readings';
export * from './import-upload';
export * from './load-catalogue';
export * from './propose-mapping';
export * from './time-zone-offset';
export * from './upload-store';
export * from './temperature-forecast-file';
export { UploadRejection } from './upload-rejection';
export * from './repeated-hour-choices';
export * from './import-stages';
