export { ApiError, type ApiErrorOptions } from './api-error';
export { validate, fieldErrors, type RequestSchemas } from './validate';
export { logger } from './logger';
export { pageParams, toPage, escapeLike } from './paging';
export { labIdOf, clientOrganisationIdOf } from './tenancy';
