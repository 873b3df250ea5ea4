import type { Database } from '../../db/client';
import { recordAudit } from '../audit/audit-service';
import { queueMail, roleAddresses } from '../mail/outbox';
import { DUE_SOON_DAYS } from './calibration-status';
import { InstrumentsService } from './instruments-service';

/** The daily mail to quality officers about calibrations due within 30 days or already expired. */
export async function sendCalibrationReminder(db: Database, today?: string): Promise<number> {
  const register = await new InstrumentsService(db).list(today);
  const due = register.filter((i) => i.active && (i.calibration?.status === 'due-soon' || i.calibration?.status === 'expired' || !i.calibration));
  if (due.length === 0) return 0;
  const lines = due.map((i) => `- ${i.tag} ${i.name}: ${i.calibration ? `${i.calibration.status === 'expired' ? 'expired' : 'due'} on ${i.calibration.dueOn} (certificate ${i.calibration.certificate})` : 'never calibrated'}`);
  await db.transaction(async (tx) => {
    const to = await roleAddresses(tx, ['quality']);
    await queueMail(tx, to.map((address) => ({
      to: address,
      subject: `Calibrations due: ${due.length} instrument(s) within ${DUE_SOON_DAYS} days or overdue`,
      body: `These instruments need calibration:\n${lines.join('\n')}\n\nRuns that use an instrument past its due date are flagged by the balance check.`,
    })));
    await recordAudit(tx, { action: 'mail.calibration-due', entityType: 'instrument', after: { instruments: due.map((i) => i.tag), recipients: to } });
  });
  return due.length;
}
