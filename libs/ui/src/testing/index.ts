// Test helpers for the Angular projects; never imported by application code.
export * from './portal-testing';
