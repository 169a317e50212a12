import type { Role } from '@ohmprint/contracts';

/** Every lab role: reading a sample is open to all staff of its lab. */
export const LAB_STAFF: readonly Role[] = ['lab-admin', 'intake-technician', 'analyst', 'reviewer'];
