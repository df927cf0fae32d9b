// Contracts shared by the API, the worker and the web app: zod schemas and their inferred types.
export * from './health';
export * from './problem';
export * from './permissions';
export * from './auth';
export * from './people';
export * from './api-tokens';
export * from './audit';
export * from './outbox';
export * from './series';
export * from './readings';
export * from './forecasts';
export * from './models';
export * from './refits';
export * from './uploads';
export * from './hierarchy';
export * from './temperature-forecasts';
export * from './misses';
