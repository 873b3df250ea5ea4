// Validation of the corrections a run document's instruments state (calibration.correction; corrections.ts).
import { CHANNEL_UNIT_KINDS } from '../../contract/channels';
import { TEXT_LIMITS, tooLong } from '../../contract/text-limits';
import { isUnit, unitsOf, type UnitKind } from './units';

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isFiniteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

type Add = (path: string, message: string) => void;

/** A certificate's correction { certificate?, gain?, offset?, unit? }: the check reads each reading as reading × gain + offset. */
export function validateCorrection(corr: unknown, p: string, add: Add): void {
  if (!isObject(corr)) return add(p, 'must be an object { certificate?, gain?, offset?, unit? }: reading × gain + offset');
  const extra = Object.keys(corr).filter((k) => !['certificate', 'gain', 'offset', 'unit'].includes(k));
  if (extra.length) add(p, `has unknown field(s) ${extra.join(', ')}; a correction is { certificate?, gain?, offset?, unit? }`);
  const cert = corr['certificate'];
  if (cert !== undefined && (typeof cert !== 'string' || cert === '' || cert.length > TEXT_LIMITS.certificate)) add(`${p}.certificate`, `must be the certificate's number as text (1 to ${TEXT_LIMITS.certificate} characters)`);
  const gain = corr['gain'];
  if (gain !== undefined && !(isFiniteNumber(gain) && gain > 0)) add(`${p}.gain`, `must be a number greater than 0, got ${JSON.stringify(gain)}`);
  const offset = corr['offset'];
  if (offset !== undefined && !isFiniteNumber(offset)) add(`${p}.offset`, `must be a finite number, got ${JSON.stringify(offset)}`);
  if (corr['unit'] !== undefined && typeof corr['unit'] !== 'string') add(`${p}.unit`, 'must be a unit code such as "degC" or "kPa"');
  else if (typeof corr['unit'] === 'string' && corr['unit'].length > TEXT_LIMITS.unit) add(`${p}.unit`, `must be a unit code such as "degC" or "kPa"; ${tooLong(TEXT_LIMITS.unit, corr['unit'].length)}`);
}

/** A correction stated in a unit needs a unit of every reading its instrument takes (channels and the barometer). */
export function validateCorrectionUnits(input: Record<string, unknown>, add: Add): void {
  const readers: Array<{ id: unknown; kind: UnitKind }> = [];
  const readings = isObject(input['readings']) ? input['readings'] : {};
  for (const [key, kind] of Object.entries(CHANNEL_UNIT_KINDS)) {
    const ch = readings[key];
    if (isObject(ch) && ch['instrument'] !== undefined) readers.push({ id: ch['instrument'], kind });
  }
  const baro = isObject(input['ambient']) ? input['ambient']['pressure'] : undefined;
  if (isObject(baro) && baro['instrument'] !== undefined) readers.push({ id: baro['instrument'], kind: 'pressure' });
  const list: unknown[] = Array.isArray(input['instruments']) ? input['instruments'] : [];
  list.forEach((inst, i) => {
    if (!isObject(inst)) return;
    const corr = isObject(inst['calibration']) ? inst['calibration']['correction'] : undefined;
    if (!isObject(corr) || typeof corr['unit'] !== 'string') return;
    const unit = corr['unit'];
    for (const kind of new Set(readers.filter((r) => r.id === inst['id']).map((r) => r.kind))) {
      if (!isUnit(kind, unit)) add(`instruments[${i}].calibration.correction.unit`, `unknown ${kind} unit ${JSON.stringify(unit)} for a correction of ${String(inst['id'])}; use one of ${unitsOf(kind).join(', ')}`);
    }
  });
}
