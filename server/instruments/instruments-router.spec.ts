import { eq } from 'drizzle-orm';
import { mailOutbox } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { sendCalibrationReminder } from './calibration-reminder';
import { addDays, calibrationStatus, todayIso } from './calibration-status';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

const uniqueTag = (p: string) => `${p}-${Date.now().toString(36).toUpperCase().slice(-5)}`;

describe('calibration status', () => {
  it('is expired the day after the due date, due soon within 30 days, valid beyond', () => {
    expect(calibrationStatus('2026-05-31', '2026-06-01')).toBe('expired');
    expect(calibrationStatus('2026-06-01', '2026-06-01')).toBe('due-soon');
    expect(calibrationStatus('2026-07-01', '2026-06-01')).toBe('due-soon');
    expect(calibrationStatus('2026-07-02', '2026-06-01')).toBe('valid');
    expect(calibrationStatus(null, '2026-06-01')).toBe('none');
    expect(addDays('2026-02-27', 2)).toBe('2026-03-01');
  });
});

describe('GET /api/instruments', () => {
  it('lists the register with each calibration status, for every role', async () => {
    const res = await (await clientAs(h.app, 'technician')).get('/api/instruments');
    expect(res.status).toBe(200);
    const byTag = Object.fromEntries(res.body.items.map((i: { tag: string }) => [i.tag, i]));
    // The demo lab is seeded relative to today: TC-7 is due within 30 days, LD-3 is past due.
    expect(byTag['TC-7'].calibration.status).toBe('due-soon');
    expect(byTag['LD-3'].calibration.status).toBe('expired');
    expect(byTag['PG-2'].calibration.status).toBe('valid');
  });

  it('carries the corrections the latest certificate states, so the run entry can say what the check will read', async () => {
    const quality = await clientAs(h.app, 'quality');
    const tag = uniqueTag('TQ');
    const created = await quality.post('/api/instruments', { tag, name: 'Pt100 probe', kind: 'temperature', unit: 'degC' });
    expect(created.status).toBe(201);
    // Invented demo certificates: an older one with no correction, the latest with corrected = reading × 1.0004 − 0.05 °C.
    const older = await quality.post(`/api/instruments/${created.body.id}/calibrations`, {
      calibratedOn: '2025-01-10', dueOn: '2026-01-10', certificate: 'HGT-CAL-2025-007', expandedUncertainty: 0.01,
    });
    expect(older.status).toBe(201);
    const latest = await quality.post(`/api/instruments/${created.body.id}/calibrations`, {
      calibratedOn: '2026-01-10', dueOn: '2027-01-10', certificate: 'HGT-CAL-2026-118', expandedUncertainty: 0.01, corrections: { gain: 1.0004, offset: -0.05 },
    });
    expect(latest.status).toBe(201);
    const list = await (await clientAs(h.app, 'technician')).get('/api/instruments');
    const item = list.body.items.find((i: { tag: string }) => i.tag === tag);
    expect(item.calibration).toMatchObject({ certificate: 'HGT-CAL-2026-118', corrections: { gain: 1.0004, offset: -0.05 } });
    // A certificate that states none lists an empty object, never a missing field.
    const plain = list.body.items.find((i: { tag: string }) => i.tag === 'PG-2');
    expect(plain.calibration.corrections).toEqual({});
  });

  it('stores only the corrections a certificate states: a null (an empty form field) is "not stated", never "gain null"', async () => {
    const quality = await clientAs(h.app, 'quality');
    const created = await quality.post('/api/instruments', { tag: uniqueTag('TN'), name: 'Pt100 probe', kind: 'temperature', unit: 'degC' });
    const res = await quality.post(`/api/instruments/${created.body.id}/calibrations`, {
      calibratedOn: '2026-01-10', dueOn: '2027-01-10', certificate: 'HGT-CAL-2026-119', expandedUncertainty: 0.01, corrections: { gain: null, offset: -0.05 },
    });
    expect(res.status).toBe(201);
    expect(res.body.corrections).toEqual({ offset: -0.05 });
    const none = await quality.post(`/api/instruments/${created.body.id}/calibrations`, {
      calibratedOn: '2026-02-10', dueOn: '2027-02-10', certificate: 'HGT-CAL-2026-120', expandedUncertainty: 0.01, corrections: { gain: null, offset: null },
    });
    expect(none.body.corrections).toEqual({});
  });

  it('answers 401 without a session and 404 for an unknown instrument', async () => {
    expect((await (await clientAs(h.app, null)).get('/api/instruments')).status).toBe(401);
    const res = await (await clientAs(h.app, 'quality')).get('/api/instruments/999999');
    expect(res.status).toBe(404);
    expect((await (await clientAs(h.app, 'quality')).get('/api/instruments/abc')).status).toBe(404);
  });
});

describe('POST /api/instruments and calibrations', () => {
  it('lets a quality officer register an instrument and add a calibration, both audited', async () => {
    const quality = await clientAs(h.app, 'quality');
    const tag = uniqueTag('PG');
    const created = await quality.post('/api/instruments', { tag, name: 'Spare pressure transducer', kind: 'pressure', unit: 'kPa', rangeMin: 0, rangeMax: 600, spec: { percentOfFullScale: 0.1, fullScale: 600 } });
    expect(created.status).toBe(201);
    const today = todayIso();
    const cal = await quality.post(`/api/instruments/${created.body.id}/calibrations`, {
      calibratedOn: today, dueOn: addDays(today, 365), certificate: 'HIAT-CAL-9001', expandedUncertainty: 0.4, coverageFactor: 2,
    });
    expect(cal.status).toBe(201);
    const detail = await quality.get(`/api/instruments/${created.body.id}`);
    expect(detail.body.calibrations).toHaveLength(1);
    expect(detail.body.calibrations[0]).toMatchObject({ certificate: 'HIAT-CAL-9001', status: 'valid' });
    const trail = await quality.get(`/api/audit?entityType=instrument&pageSize=10`);
    const actions = trail.body.items.filter((e: { entityId: string }) => e.entityId === String(created.body.id)).map((e: { action: string }) => e.action);
    expect(actions).toEqual(['calibration.create', 'instrument.create']);
  });

  it('answers 403 to a technician, 400 naming the bad field, 409 for a duplicate tag, 404 for an unknown instrument', async () => {
    const tech = await clientAs(h.app, 'technician');
    expect((await tech.post('/api/instruments', { tag: 'XX-1', name: 'Nope', kind: 'pressure', unit: 'kPa' })).status).toBe(403);
    const quality = await clientAs(h.app, 'quality');
    const bad = await quality.post('/api/instruments', { tag: uniqueTag('TT'), name: 'Thermometer', kind: 'temperature', unit: 'kPa' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].field).toBe('unit');
    const dup = await quality.post('/api/instruments', { tag: 'PG-2', name: 'Again', kind: 'pressure', unit: 'kPa' });
    expect(dup.status).toBe(409);
    const badDates = await quality.post('/api/instruments/1/calibrations', { calibratedOn: '2026-05-01', dueOn: '2026-04-01', certificate: 'X-1', expandedUncertainty: 1 });
    expect(badDates.status).toBe(400);
    const missing = await quality.post('/api/instruments/999999/calibrations', { calibratedOn: '2026-05-01', dueOn: '2027-04-01', certificate: 'X-1', expandedUncertainty: 1 });
    expect(missing.status).toBe(404);
  });
});

describe('the calibration reminder', () => {
  it('mails each quality officer the instruments due within 30 days or overdue', async () => {
    const count = await sendCalibrationReminder(h.handle.db);
    expect(count).toBeGreaterThanOrEqual(2);
    const mails = await h.handle.db.select().from(mailOutbox).where(eq(mailOutbox.recipient, demoEmail('quality')));
    const reminder = mails.find((m) => m.subject.startsWith('Calibrations due'))!;
    expect(reminder.body).toContain('TC-7');
    expect(reminder.body).toContain('LD-3');
    expect(reminder.body).not.toContain('PG-2 ');
  });
});
