import { and, count, eq, gt, inArray, ne, sql, type SQL } from 'drizzle-orm';
import type { HomeQueue } from '../../contract/api/home';
import type { Database } from '../../db/client';
import { people, runs, type RunState } from '../../db/schema';
import type { SessionPerson } from '../core/session';
import { InstrumentsService } from '../instruments/instruments-service';
import { overPressureFilter } from '../runs/run-filters';
import { visibleProjectIds } from '../runs/run-access';

/** One entry of a person's home queue: a count and where the list behind it lives. */
export type Queue = HomeQueue;

/** Runs whose readings went above the vessel's rated pressure: a safety tile for reviewers and quality officers. */
const OVER_PRESSURE_TILE = (count: number): Queue => ({
  key: 'over-pressure', label: 'Runs above the rated pressure', count, link: '/runs', queryParams: { safety: 'over-pressure' },
});

export class HomeService {
  constructor(private readonly db: Database) {}

  private async countRuns(...filters: SQL[]): Promise<number> {
    const [{ n }] = await this.db.select({ n: count() }).from(runs).where(and(...filters));
    return n;
  }

  private async authorQueues(person: SessionPerson): Promise<Queue[]> {
    const mine = (state: RunState) => this.countRuns(eq(runs.authorId, person.id), eq(runs.state, state));
    const [drafts, returned, submitted] = await Promise.all([mine('draft'), mine('returned'), mine('submitted')]);
    return [
      { key: 'my-drafts', label: 'My drafts', count: drafts, link: '/runs', queryParams: { state: 'draft', mine: 'true' } },
      { key: 'returned-to-me', label: 'Returned to me for correction', count: returned, link: '/runs', queryParams: { state: 'returned', mine: 'true' } },
      { key: 'waiting-for-review', label: 'Waiting for review', count: submitted, link: '/runs', queryParams: { state: 'submitted', mine: 'true' } },
    ];
  }

  private async reviewerQueues(person: SessionPerson): Promise<Queue[]> {
    const projectIds = (await visibleProjectIds(this.db, person)) ?? [];
    // Segregation of duties: one's own runs are never in one's review queue.
    const base = [inArray(runs.projectId, projectIds), eq(runs.state, 'submitted'), ne(runs.authorId, person.id)];
    const [review, breaking, overPressure] = projectIds.length === 0
      ? [0, 0, 0]
      : await Promise.all([
        this.countRuns(...base),
        this.countRuns(...base, eq(runs.verdict, 'breaks')),
        this.countRuns(inArray(runs.projectId, projectIds), overPressureFilter()),
      ]);
    // Each tile's link carries exactly the filters its count used (others: the same segregation of duties).
    return [
      { key: 'runs-to-review', label: 'Runs to review', count: review, link: '/runs', queryParams: { state: 'submitted', others: 'true' } },
      { key: 'breaking-balances', label: 'Balances that break', count: breaking, link: '/runs', queryParams: { state: 'submitted', verdict: 'breaks', others: 'true' } },
      OVER_PRESSURE_TILE(overPressure),
    ];
  }

  private async qualityQueues(): Promise<Queue[]> {
    const register = await new InstrumentsService(this.db).list();
    const tally = (status: string) => register.filter((i) => (i.calibration?.status ?? 'none') === status).length;
    const [submitted, overPressure] = await Promise.all([this.countRuns(eq(runs.state, 'submitted')), this.countRuns(overPressureFilter())]);
    return [
      { key: 'calibrations-due', label: 'Calibrations due within 30 days', count: tally('due-soon'), link: '/instruments', queryParams: { status: 'due-soon' } },
      // Each tile counts exactly what its link lists: overdue calibrations and never-calibrated instruments are two lists.
      { key: 'out-of-calibration', label: 'Instruments out of calibration', count: tally('expired'), link: '/instruments', queryParams: { status: 'expired' } },
      { key: 'never-calibrated', label: 'Instruments with no calibration', count: tally('none'), link: '/instruments', queryParams: { status: 'none' } },
      { key: 'runs-waiting', label: 'Runs waiting for review', count: submitted, link: '/runs', queryParams: { state: 'submitted' } },
      OVER_PRESSURE_TILE(overPressure),
    ];
  }

  private async adminQueues(): Promise<Queue[]> {
    const [[{ active }], [{ locked }]] = await Promise.all([
      this.db.select({ active: count() }).from(people).where(eq(people.active, true)),
      this.db.select({ locked: count() }).from(people).where(gt(people.lockedUntil, sql`now()`)),
    ]);
    return [
      { key: 'people', label: 'People with access', count: active, link: '/people' },
      { key: 'locked-accounts', label: 'Locked accounts', count: locked, link: '/people' },
    ];
  }

  async queues(person: SessionPerson): Promise<Queue[]> {
    switch (person.role) {
      case 'technician':
      case 'assistant':
        return this.authorQueues(person);
      case 'investigator':
        return this.reviewerQueues(person);
      case 'quality':
        return this.qualityQueues();
      case 'admin':
        return this.adminQueues();
    }
  }
}
