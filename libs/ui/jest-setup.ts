import { setupZonelessTestEnv } from 'jest-preset-angular/setup-env/zoneless';

setupZonelessTestEnv();

// Component tests compile Material on first use; on a shared 2-core machine that can pass 5 s.
jest.setTimeout(30000);
