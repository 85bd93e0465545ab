/*
 * The request and response schemas of the Counterpoise API, in zod: one source for the server's
 * validation, the OpenAPI document and the client's types. Metadata sits in zod's own `.meta()`, so this
 * folder needs nothing but zod and stays usable in the browser.
 */
export * from './problem';
export * from './health';
export * from './field-errors';
export * from './calc';
export * from './calc-routes';
export * from './batch';
export * from './keys';
export * from './usage';
export * from './accounts';
export * from './records';
export * from './people-rules';
export * from './jobs';
export * from './reports';
export * from './photos';
export * from './readings-import';
export * from './machine-history';
export * from './job-calculations';
export * from './job-rules';
export * from './job-local';
