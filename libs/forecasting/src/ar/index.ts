// Filled by this area's estimators as they land.
export {};
