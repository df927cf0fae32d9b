// Contracts shared by the API, the worker and the web app: zod schemas and their inferred types.
export * from './health';
export * from './problem';
