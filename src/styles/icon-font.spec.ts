import { readFileSync } from 'node:fs';
import { join } from 'node:path';

// The icon font is a subset of Material Symbols holding only the icons the app names
// (tools/subset-icons.sh). An icon used in a template but missing from it would show its name as text.
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { collectIconNames, iconNamesIn } = require('../../tools/icon-names.js') as {
  collectIconNames: () => string[];
  iconNamesIn: (source: string) => Set<string>;
};

const subsetList = readFileSync(join(__dirname, 'fonts', 'material-symbols-subset.txt'), 'utf8')
  .split('\n')
  .map((line) => line.trim())
  .filter(Boolean);

describe('the icon font subset', () => {
  it('holds every icon name used in the templates and TypeScript of the app', () => {
    const used = collectIconNames();
    const missing = used.filter((name) => !subsetList.includes(name));
    expect(missing).toEqual([]);
    // The collector must have found the app's icons at all (navigation, verdicts, home queues).
    expect(used).toEqual(expect.arrayContaining(['home', 'check_circle', 'rate_review', 'inbox', 'edit_note']));
  });

  it('finds icons in each way the app names them', () => {
    const found = iconNamesIn(`
      <mat-icon aria-hidden="true">science</mat-icon>
      <mat-icon>{{ shown() ? 'visibility_off' : 'visibility' }}</mat-icon>
      <mat-icon>{{ result.verdict === 'closes' ? 'check' : 'info' }}</mat-icon>
      <mat-icon fontIcon="bolt"></mat-icon>
      const LINKS = [{ path: '/x', icon: 'speed' }];
      const STATE_ICONS: Readonly<Record<RunState, string>> = {
        draft: 'edit_note',
        rejected: 'block',
      };
      return QUEUE_ICONS[queue.key] ?? 'inbox';
    `);
    expect([...found].sort()).toEqual(
      ['block', 'bolt', 'check', 'edit_note', 'inbox', 'info', 'science', 'speed', 'visibility', 'visibility_off'].sort(),
    );
  });
});
