// API tests seed, queue and wait on a real database; engine tests run thousands of Monte Carlo draws.
jest.setTimeout(60_000);
