// `GET /api/home` is the contract's (contract/api/home.ts), shared with the server.
export type { HomeQueue, HomeSummary } from '@contract';
