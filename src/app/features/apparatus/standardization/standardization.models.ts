// `GET /api/apparatus/:id/standardizations` is the contract's (contract/api/standardizations.ts), shared with the server.
export type {
  ApparatusChange,
  ChartLimits,
  ChartSegment,
  DueApparatus,
  SeriesRun,
  Standardization,
  StandardizationOverview,
  ValueU,
} from '@contract';
/** The one meaning a standardization signature can have: the list the server checks against. */
export { STANDARDIZATION_MEANINGS } from '@contract';
