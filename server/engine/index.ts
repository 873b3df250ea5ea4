// Public surface of the energy-balance engine.
export { checkRunDocument, evaluateBalance, validateSettings, EngineInputError, MAX_DRAWS } from './balance';
export type { BalanceResult, BalanceSettings, BudgetEntry, CheckResult } from './balance';
export { validateRunDocument, RUN_FORMAT, RUN_FORMAT_VERSION } from './run-document';
export type { RunDocument, ValidationError, ValidationResult, Quantity, Instrument, Channel, Readings, Apparatus, GasSpec, AmountSpec } from './run-document';
export type { Flag, FlagCode } from './flags';
export type { Hint, HintCode } from './hints';
export type { Verdict } from './verdict';
export { ENGINE_VERSION } from './version';
export { canonicalJson, sha256Canonical } from './canonical';
export { propagate, typeAInputs } from './propagation';
export type { InputQuantity, PropagationResult } from './propagation';
export { monteCarlo } from './monte-carlo';
