// A journey drives a real browser through several screens; on a busy 2-core machine one can take
// well over jest's default. The project config cannot set this: testTimeout is global in jest.
jest.setTimeout(120_000);
