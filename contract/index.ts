// The contract between Qwell's client and server: the words both must agree on (roles, run states,
// verdicts, signature meanings, channels, units, audit action words) and the shapes of the API's requests and responses.
// Types and small constant tables only: both builds compile it, and it imports nothing else.
export * from './roles';
export * from './runs';
export * from './channels';
export * from './units';
export * from './wire';
export * from './audit';
export * from './corrections';
export * from './text-limits';
export * from './api/runs';
export * from './api/result';
export * from './api/home';
export * from './api/standardizations';
export * from './api/imports';
