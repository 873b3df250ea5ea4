import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';

import { BackoffPoll, POLL_DELAYS_MS } from './backoff-poll';

@Component({ template: '' })
class Host {
  readonly calls: number[] = [];
  readonly poll = new BackoffPoll(() => this.calls.push(Date.now()));
}

describe('BackoffPoll', () => {
  beforeEach(() => jest.useFakeTimers());
  afterEach(() => jest.useRealTimers());

  it('waits longer after each empty answer, up to the last delay, and keeps one timer at a time', () => {
    const fixture = TestBed.createComponent(Host);
    const host = fixture.componentInstance;
    const start = Date.now();
    for (let i = 0; i < 7; i++) {
      host.poll.schedule();
      host.poll.schedule(); // a second call while one waits adds nothing
      jest.runOnlyPendingTimers();
    }
    const gaps = host.calls.map((t, i) => t - (i === 0 ? start : host.calls[i - 1]));
    expect(gaps).toEqual([1000, 2000, 4000, 8000, 15000, 15000, 15000]);
    expect(POLL_DELAYS_MS.at(-1)).toBe(15000);
  });

  it('stops when told and starts from the shortest wait again', () => {
    const fixture = TestBed.createComponent(Host);
    const host = fixture.componentInstance;
    host.poll.schedule();
    jest.advanceTimersByTime(1000);
    host.poll.schedule();
    host.poll.stop();
    jest.advanceTimersByTime(60_000);
    expect(host.calls).toHaveLength(1);
    host.poll.schedule();
    jest.advanceTimersByTime(1000);
    expect(host.calls).toHaveLength(2);
  });

  it('gives up after its most attempts until stopped', () => {
    const fixture = TestBed.createComponent(Host);
    const host = fixture.componentInstance;
    for (let i = 0; i < 60; i++) {
      host.poll.schedule();
      jest.runOnlyPendingTimers();
    }
    expect(host.calls).toHaveLength(45);
  });

  it('stops with its component', () => {
    const fixture = TestBed.createComponent(Host);
    const host = fixture.componentInstance;
    host.poll.schedule();
    fixture.destroy();
    jest.advanceTimersByTime(60_000);
    expect(host.calls).toHaveLength(0);
  });
});
