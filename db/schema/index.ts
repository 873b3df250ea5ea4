export * from './people';
export * from './equipment';
export * from './runs';
export * from './audit';
export * from './imports';
export * from './data-versions';
export * from './standardizations';
export * from './audit-checkpoints';
