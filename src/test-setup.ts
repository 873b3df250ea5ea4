import 'jest-canvas-mock';
import { setupZonelessTestEnv } from 'jest-preset-angular/setup-env/zoneless';

setupZonelessTestEnv();

// jsdom has no layout engine; CDK and chart.js only need the constructor to exist.
class ResizeObserverStub {
  observe(): void {}
  unobserve(): void {}
  disconnect(): void {}
}
Object.defineProperty(globalThis, 'ResizeObserver', { value: ResizeObserverStub, writable: true });

// Harness-driven specs render real Material components; on a loaded 2-core machine Jest's default
// 5 s per test is too short for a correct spec. A hang still fails, after 30 s.
jest.setTimeout(30_000);
