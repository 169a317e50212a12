// Request/response schemas shared by the API and both portals. One line per file.
import './error-messages';
export * from './roles';
export * from './problem';
export * from './paging';
export * from './common-fields';
export * from './auth';
export * from './invitations';
export * from './staff';
export * from './client-organisations';
export * from './labs';
export * from './health';
export * from './lab-profile';
export * from './audit-log';
export * from './lab';
export * from './lab/reports';
export * from './billing';
export * from './notifications';
export * from './field-words';
