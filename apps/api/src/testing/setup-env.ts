import { loadTestEnvironment } from './test-environment';

loadTestEnvironment();
