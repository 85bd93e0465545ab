/*
 * Prints the server's OpenAPI 3.1 document on stdout, as `/api/openapi.json` serves it, without a
 * running server: the app is built over an in-memory database and its document read from
 * `app.locals`, where `createApp` leaves it. scripts/build-client.mjs generates the client's types from it.
 */
import { createApp } from '../../../server/src/app';
import { migrateDatabase, openDatabase } from '../../../server/src/db/database';
import { UsageLog } from '../../../server/src/usage/usage-log';

const database = openDatabase(':memory:');
migrateDatabase(database);
const usageLog = new UsageLog(database);
const document = createApp({ database, usageLog }).locals.openApiDocument;
usageLog.close();
database.sqlite.close();
if (document === undefined) throw new Error('createApp left no OpenAPI document in app.locals.');
process.stdout.write(`${JSON.stringify(document, null, 2)}\n`);
