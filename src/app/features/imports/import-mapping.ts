import {
  ImportChannel,
  ImportMapping,
  PressureReference,
  PreviewColumn,
  ReadingChannel,
  TimeUnit,
  UNITS_BY_CHANNEL,
} from './imports.models';

/** What the person chose for one column; channel null means the column is not imported. */
export interface ColumnChoice {
  index: number;
  header: string;
  channel: ImportChannel | null;
  unit: string | null;
  reference: PressureReference | null;
}

/** Choices prefilled from Qwell's guesses (or from a saved column map when one is given). */
export function choicesFrom(columns: readonly PreviewColumn[], mapping?: ImportMapping | null): ColumnChoice[] {
  const base = columns.map((c) => ({
    index: c.index,
    header: c.header,
    channel: c.guess.channel,
    unit: c.guess.unit,
    reference: c.guess.reference ?? null,
  }));
  if (!mapping) return keepOneTime(base);
  return base.map((c) => {
    if (c.index === mapping.time.index) return { ...c, channel: 'time', unit: mapping.time.unit, reference: null };
    const m = mapping.columns.find((x) => x.index === c.index);
    return m ? { ...c, channel: m.channel, unit: m.unit, reference: m.reference ?? null } : { ...c, channel: null, unit: null, reference: null };
  });
}

/** Only the first column guessed as time stays time; a run has one time column. */
function keepOneTime(choices: ColumnChoice[]): ColumnChoice[] {
  let seen = false;
  return choices.map((c) => {
    if (c.channel !== 'time') return c;
    if (seen) return { ...c, channel: null, unit: null };
    seen = true;
    return c;
  });
}

/** Sets one column's channel; its unit is kept when it fits the new channel, and time moves off any other column. */
export function withChannel(choices: readonly ColumnChoice[], index: number, channel: ImportChannel | null): ColumnChoice[] {
  return choices.map((c) => {
    if (c.index === index) {
      const unit = channel && c.unit && UNITS_BY_CHANNEL[channel].includes(c.unit) ? c.unit : channel ? UNITS_BY_CHANNEL[channel][0] : null;
      return { ...c, channel, unit, reference: channel === 'pressure' ? (c.reference ?? 'absolute') : null };
    }
    if (channel && c.channel === channel) return { ...c, channel: null, unit: null, reference: null };
    return c;
  });
}

export function withUnit(choices: readonly ColumnChoice[], index: number, unit: string): ColumnChoice[] {
  return choices.map((c) => (c.index === index ? { ...c, unit } : c));
}

export function withReference(choices: readonly ColumnChoice[], index: number, reference: PressureReference): ColumnChoice[] {
  return choices.map((c) => (c.index === index ? { ...c, reference } : c));
}

/** The mapping the choices add up to, or what is still missing. */
export function mappingFrom(choices: readonly ColumnChoice[]): { mapping: ImportMapping | null; missing: string[] } {
  const missing: string[] = [];
  const time = choices.find((c) => c.channel === 'time');
  if (!time) missing.push('Choose the column that holds the time.');
  const readings = choices.filter((c) => c.channel && c.channel !== 'time');
  if (readings.length === 0) missing.push('Choose at least one column of readings.');
  for (const c of readings) if (!c.unit) missing.push(`Choose the unit of "${c.header}".`);
  for (const c of readings) {
    if (c.channel === 'pressure' && !c.reference) missing.push(`Say whether the pressure in "${c.header}" is absolute or gauge.`);
  }
  if (!time || missing.length) return { mapping: null, missing };
  return {
    mapping: {
      time: { index: time.index, unit: (time.unit ?? 's') as TimeUnit },
      columns: readings.map((c) => ({
        index: c.index,
        channel: c.channel as ReadingChannel,
        unit: c.unit!,
        ...(c.channel === 'pressure' && c.reference ? { reference: c.reference } : {}),
      })),
    },
    missing,
  };
}
