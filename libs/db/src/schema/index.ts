/** Every table, enum and stored type of Loadwright's database, one module per domain. */
export * from './organisation';
export * from './people';
export * from './sign-in';
export * from './api-tokens';
export * from './audit';
export * from './series';
export * from './uploads';
export * from './observations';
export * from './holidays';
export * from './temperature-forecasts';
export * from './models';
export * from './refits';
export * from './forecasts';
export * from './misses';
export * from './workers';
export * from './reconciliations';
export * from './mail';
