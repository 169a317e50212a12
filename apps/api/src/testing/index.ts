// Harness for API integration tests: one app and one fresh database per file.
export { useTestApp, type TestApp } from './test-app';
export { demoEmail, DEMO_PASSWORD, type DemoLabKey } from './demo-accounts';
export { readMailbox, clearMailbox, type CaughtMail } from './mailbox';
export { latestEmailTo, linkToken } from './outbox';
export { analyseDemoSample, measureDemoSample, type MeasuredDemoSample } from './demo-workflow';
export { startLocalPaymentService, eventually, type LocalPaymentService } from './payment-service';
export { enrolReferenceLots, type EnrolledLots } from './reference-lots';
export { approveAndIssue, issuedReport } from './report-issuance';
