// Run entry at the bench: create, edit, readings, submit (and the shapes the run page shares). The
// words and the API's shapes are the contract's (contract/runs.ts, contract/channels.ts, contract/api/runs.ts).
export { READING_CHANNELS, READING_SI_UNITS, RUN_PROCESSES } from '@contract';
export type {
  AmountSetup,
  ChannelEntry,
  CreateRunBody,
  EnteredQuantity,
  GasSetup,
  ReadingChannel,
  ReadingsBody,
  RunChecklistResponse,
  RunProcess,
  RunReadings,
  RunSetupBody as RunSetup,
  UpdateRunBody,
} from '@contract';

/** What the server answers to a write: the run's new version at least. */
export interface RunVersion {
  id: number;
  code?: string;
  version: number;
}
