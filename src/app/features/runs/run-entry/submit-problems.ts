import { CHANNEL_LABELS } from '@contract';

import { FieldProblem } from '../../../core/http/problem-details';
import { ReadingChannel } from '../run-entry.models';

const FIXED: Readonly<Record<string, string>> = {
  'ambient.pressure': 'The ambient pressure',
  'ambient.temperature': 'The ambient temperature',
  amount: 'The amount of gas',
  gas: 'The gas',
  'process.index': 'The polytropic index n',
  runDate: 'The run date',
  title: 'The title',
};

function words(path: string): string {
  return path
    .replace(/\[(\d+)\]/g, (_, i: string) => ` ${Number(i) + 1}`)
    .split('.')
    .map((part) => part.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase())
    .join(' ');
}

function channelLabel(name: string): string {
  return (CHANNEL_LABELS[name as ReadingChannel] ?? name).toLowerCase();
}

/** Names the part of the run a server field path points at, in words. */
export function fieldLabel(field: string): string {
  if (FIXED[field]) {
    return FIXED[field];
  }
  if (/^readings\.time(\.values)?(\[\d+\])?$/.test(field)) {
    const index = /\[(\d+)\]/.exec(field);
    return index ? `Reading ${Number(index[1]) + 1} of the time column` : 'The time column';
  }
  const reading = /^readings\.(\w+)(?:\.values)?\[(\d+)\]$/.exec(field);
  if (reading) {
    return `Reading ${Number(reading[2]) + 1} of the ${channelLabel(reading[1])} column`;
  }
  const column = /^readings\.(\w+)(?:\.\w+)?$/.exec(field);
  if (column) {
    return `The ${channelLabel(column[1])} column`;
  }
  const top = Object.keys(FIXED).find((key) => field.startsWith(`${key}.`));
  if (top) {
    return `${FIXED[top]} (${words(field.slice(top.length + 1))})`;
  }
  return `The ${words(field)}`;
}

/** One problem the server listed, as a sentence a person can act on. */
export function problemSentence(problem: FieldProblem): string {
  // The server now words submit problems as whole sentences ("Choose the gas."); older fragments get a subject.
  if (/^[A-Z]/.test(problem.message.trim())) {
    return problem.message.trim();
  }
  const sentence = `${fieldLabel(problem.field)} ${problem.message.trim()}`;
  return /[.!?]$/.test(sentence) ? sentence : `${sentence}.`;
}
