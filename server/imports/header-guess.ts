import type { ImportChannel, PressureReference } from '../../contract/channels';

/** What a column holds: a reading channel, or the time of each reading (the contract's list). */
export type { ImportChannel };

export interface ColumnGuess {
  channel: ImportChannel | null;
  /** A unit as the engine names it (contract/units.ts), 'iso' for date-times; null when the header names none. */
  unit: string | null;
  reference?: PressureReference;
}

/** Unit spellings seen in logger headers (lower case, spaces removed) → [channel, engine unit, reference]. */
const UNIT_SPELLINGS: Record<string, [ImportChannel, string, ('absolute' | 'gauge')?]> = {
  pa: ['pressure', 'Pa'], kpa: ['pressure', 'kPa'], mpa: ['pressure', 'MPa'], hpa: ['pressure', 'mbar'],
  bar: ['pressure', 'bar'], mbar: ['pressure', 'mbar'], barg: ['pressure', 'bar', 'gauge'], bara: ['pressure', 'bar', 'absolute'],
  atm: ['pressure', 'atm'], psi: ['pressure', 'psi'], psig: ['pressure', 'psi', 'gauge'], psia: ['pressure', 'psi', 'absolute'],
  torr: ['pressure', 'torr'], mmhg: ['pressure', 'mmHg'],
  m3: ['volume', 'm3'], 'm³': ['volume', 'm3'], l: ['volume', 'L'], ml: ['volume', 'mL'], cm3: ['volume', 'cm3'], 'cm³': ['volume', 'cm3'], cc: ['volume', 'cm3'],
  m: ['displacement', 'm'], mm: ['displacement', 'mm'],
  k: ['temperature', 'K'], kelvin: ['temperature', 'K'],
  '°c': ['temperature', 'degC'], 'ºc': ['temperature', 'degC'], '˚c': ['temperature', 'degC'], degc: ['temperature', 'degC'], c: ['temperature', 'degC'], celsius: ['temperature', 'degC'],
  '°f': ['temperature', 'degF'], 'ºf': ['temperature', 'degF'], '˚f': ['temperature', 'degF'], degf: ['temperature', 'degF'], f: ['temperature', 'degF'], fahrenheit: ['temperature', 'degF'],
  v: ['voltage', 'V'], mv: ['voltage', 'mV'], volt: ['voltage', 'V'], volts: ['voltage', 'V'],
  a: ['current', 'A'], ma: ['current', 'mA'], amp: ['current', 'A'], amps: ['current', 'A'],
  w: ['power', 'W'], mw: ['power', 'mW'], watt: ['power', 'W'], watts: ['power', 'W'],
  ms: ['time', 'ms'], msec: ['time', 'ms'], milliseconds: ['time', 'ms'],
  s: ['time', 's'], sec: ['time', 's'], secs: ['time', 's'], seconds: ['time', 's'],
  min: ['time', 'min'], mins: ['time', 'min'], minutes: ['time', 'min'],
  h: ['time', 'h'], hr: ['time', 'h'], hrs: ['time', 'h'], hours: ['time', 'h'],
  iso: ['time', 'iso'], iso8601: ['time', 'iso'],
};

/** Header words → channel. Case matters for the one-letter symbols: t is time, T is temperature. */
const NAME_RULES: Array<[RegExp, ImportChannel]> = [
  [/^(timestamp|date ?time|date|clock|datum)$/i, 'time'],
  [/^(t|time|elapsed( time)?|zeit|run time)$/, 'time'],
  [/^(Time|TIME|Elapsed)/, 'time'],
  [/^(p|P)([ _-]?(abs|gauge|g|a|\d+))?$|pressure|druck/i, 'pressure'],
  [/^(T|θ|Θ)([ _-]?\w+)?$|temp/i, 'temperature'],
  [/^(V|Vol)$|volume/i, 'volume'],
  [/position|displacement|stroke|travel|^(x|s)$/i, 'displacement'],
  [/^(U|E)([ _-]?\w+)?$|voltage|volt/i, 'voltage'],
  [/^(I)([ _-]?\w+)?$|current|amps?$/i, 'current'],
  [/power|^(P_?el|Pw|Q_?dot)$/i, 'power'],
];

function unitFrom(raw: string): [ImportChannel, string, ('absolute' | 'gauge')?] | undefined {
  const key = raw.trim().toLowerCase().replace(/\s+/g, '');
  return UNIT_SPELLINGS[key] ?? UNIT_SPELLINGS[key.replace(/^deg/, '°')];
}

/** Splits "P (kPa)", "Pressure [bar]", "T/°C", "t in min", "Temp, degF" into name and unit text. */
export function splitHeader(header: string): { name: string; unit: string | null } {
  const text = header.trim().replace(/\s+/g, ' ');
  const bracket = /^(.*?)\s*[([{]\s*([^)\]}]*)\s*[)\]}]\s*$/.exec(text);
  if (bracket && bracket[2]) return { name: bracket[1].trim(), unit: bracket[2].trim() };
  const slash = /^(.*\S)\s*\/\s*([^/]+)$/.exec(text);
  if (slash && unitFrom(slash[2])) return { name: slash[1].trim(), unit: slash[2].trim() };
  const word = /^(.*?\S)(?:\s+in\s+|\s*,\s*|\s+)(\S+)$/i.exec(text);
  if (word && unitFrom(word[2]) && word[2].length > 1) return { name: word[1].trim(), unit: word[2].trim() };
  return { name: text, unit: null };
}

function referenceFrom(name: string, unitRef: ('absolute' | 'gauge') | undefined): 'absolute' | 'gauge' | undefined {
  if (unitRef) return unitRef;
  if (/gauge|gage|(^|[ _-])g$|\(g\)|rel(ative)?\b/i.test(name)) return 'gauge';
  if (/abs(olute)?\b|(^|[ _-])a$/i.test(name)) return 'absolute';
  return undefined;
}

/** Guesses channel, unit and pressure reference from a header, with a confidence between 0 and 1. */
export function guessColumn(header: string): { guess: ColumnGuess; confidence: number } {
  const { name, unit } = splitHeader(header);
  const byUnit = unit ? unitFrom(unit) : undefined;
  const byName = NAME_RULES.find(([re]) => re.test(name))?.[1] ?? null;
  let channel: ImportChannel | null = null;
  let engineUnit: string | null = null;
  let confidence = 0;
  if (byUnit) {
    channel = byUnit[0];
    engineUnit = byUnit[1];
    // "V (mL)" is a volume whatever the name says; the unit decides, the name only raises confidence.
    confidence = byName === channel ? 0.95 : byName ? 0.6 : 0.8;
    if (channel === 'displacement' && byName === 'time') confidence = 0.3;
  } else if (byName) {
    channel = byName;
    confidence = 0.5;
    if (byName === 'time' && /^(timestamp|date ?time|date|clock|datum)$/i.test(name)) {
      engineUnit = 'iso';
      confidence = 0.9;
    }
  }
  const guess: ColumnGuess = { channel, unit: engineUnit };
  if (channel === 'pressure') {
    const reference = referenceFrom(name, byUnit?.[2]);
    if (reference) guess.reference = reference;
  }
  return { guess, confidence };
}
