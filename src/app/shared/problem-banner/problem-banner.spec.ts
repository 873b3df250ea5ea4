import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';

import { ProblemDetails } from '../../core/http/problem-details';
import { ProblemBanner } from './problem-banner';

const refused: ProblemDetails = {
  type: 'about:blank',
  title: 'Bad request',
  status: 400,
  detail: 'The calibration was not saved: 2 fields are not valid.',
  errors: [
    { field: 'dueOn', message: 'dueOn must come after calibratedOn' },
    { field: 'certificate', message: 'certificate must be at most 80 characters' },
  ],
};

@Component({
  imports: [ProblemBanner],
  template: `
    <qw-problem-banner [problem]="problem()" [heading]="heading()" [messages]="messages()" [retryLabel]="retryLabel()" (retry)="retries = retries + 1">
      <p class="advice">Your entries are kept.</p>
    </qw-problem-banner>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly problem = signal<ProblemDetails | null>(null);
  readonly heading = signal<string | null>(null);
  readonly messages = signal<readonly string[] | null>(null);
  readonly retryLabel = signal<string | null>(null);
  retries = 0;
}

describe('ProblemBanner', () => {
  async function render(set: (host: Host) => void) {
    const fixture = TestBed.createComponent(Host);
    set(fixture.componentInstance);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const alert = el.querySelector('[role="alert"]');
    return {
      fixture,
      alert,
      title: alert?.querySelector('.problem-title')?.textContent?.trim() ?? null,
      detail: alert?.querySelector('.problem-detail')?.textContent?.trim() ?? null,
      fields: Array.from(alert?.querySelectorAll('.problem-fields li') ?? []).map((li) => li.textContent?.trim()),
      retry: alert?.querySelector<HTMLButtonElement>('button.problem-retry') ?? null,
    };
  }

  it('shows nothing, not even its content, while there is no problem', async () => {
    const { alert, fixture } = await render(() => undefined);
    expect(alert).toBeNull();
    expect((fixture.nativeElement as HTMLElement).querySelector('.advice')).toBeNull();
  });

  it('says the problem\'s title, its detail and every field message, with the page\'s own words under them', async () => {
    const { title, detail, fields, alert, retry } = await render((h) => h.problem.set(refused));
    expect(title).toBe('Bad request');
    expect(detail).toBe(refused.detail);
    expect(fields).toEqual(['dueOn must come after calibratedOn', 'certificate must be at most 80 characters']);
    expect(alert?.querySelector('.advice')?.textContent).toBe('Your entries are kept.');
    expect(retry).toBeNull();
  });

  it('takes the page\'s heading before the problem\'s title, and only the messages it is given', async () => {
    const { title, fields } = await render((h) => {
      h.problem.set(refused);
      h.heading.set('The calibration was not saved.');
      h.messages.set(['certificate must be at most 80 characters']);
    });
    expect(title).toBe('The calibration was not saved.');
    expect(fields).toEqual(['certificate must be at most 80 characters']);
  });

  it('says a problem made in the browser once (its title is its detail), and leaves out field messages the detail already says', async () => {
    const offline: ProblemDetails = {
      type: 'about:blank', title: "Qwell's server can't be reached.", status: 0, detail: "Qwell's server can't be reached.",
      errors: [{ field: 'runIds', message: "Qwell's server can't be reached." }],
    };
    const { title, detail, fields } = await render((h) => h.problem.set(offline));
    expect(title).toBeNull();
    expect(detail).toBe("Qwell's server can't be reached.");
    expect(fields).toEqual([]);
  });

  it('offers the page\'s retry as a button when the page has one', async () => {
    const { retry, fixture } = await render((h) => {
      h.problem.set(refused);
      h.retryLabel.set('Reload the run');
    });
    expect(retry?.textContent?.trim()).toBe('Reload the run');
    retry!.click();
    retry!.click();
    expect(fixture.componentInstance.retries).toBe(2);
  });
});
