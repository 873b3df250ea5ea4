import { checkRunDocument } from '../engine';
import { loadFixture } from '../../testing/fixture-runs';
import { checkDocument, checkOffThread, OFF_THREAD_FROM_READINGS } from './check-off-thread';

/** The isothermal fixture resampled onto n time points by linear interpolation (still a valid run document). */
function resampled(n: number) {
  const doc = loadFixture('isothermal') as unknown as { readings: Record<string, { values: number[] }> };
  const t = doc.readings['time'].values;
  const at = (values: number[], x: number) => {
    const i = Math.min(t.length - 2, Math.max(0, Math.floor(((x - t[0]) / (t[t.length - 1] - t[0])) * (t.length - 1))));
    return values[i] + ((values[i + 1] - values[i]) * (x - t[i])) / (t[i + 1] - t[i]);
  };
  const grid = Array.from({ length: n }, (_, k) => t[0] + ((t[t.length - 1] - t[0]) * k) / (n - 1));
  for (const [name, channel] of Object.entries(doc.readings)) {
    channel.values = name === 'time' ? grid : grid.map((x) => at(channel.values, x));
  }
  return doc;
}

describe('stateless checks of large documents off the event loop', () => {
  const settings = { draws: 2000, seed: 7 };

  it('a worker thread gives exactly the result of the inline check', async () => {
    const doc = resampled(OFF_THREAD_FROM_READINGS + 10);
    const inline = checkRunDocument(doc, settings);
    expect(inline.ok).toBe(true);
    expect(await checkOffThread(doc, settings)).toEqual(inline);
    expect(await checkDocument(doc, settings)).toEqual(inline);
  }, 120_000);

  it('a document the engine refuses is refused the same way in the worker', async () => {
    const doc = resampled(OFF_THREAD_FROM_READINGS) as unknown as { readings: { temperature?: unknown } };
    delete doc.readings.temperature;
    const off = await checkOffThread(doc, settings);
    expect(off).toEqual(checkRunDocument(doc, settings));
    expect(off.ok).toBe(false);
  }, 120_000);
});
