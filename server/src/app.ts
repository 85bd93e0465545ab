import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import express, { type Express, Router } from 'express';
import { randomBytes } from 'node:crypto';
import { AccountsRepo } from './accounts/accounts.repo';
import { authRegistry } from './auth/auth.openapi';
import { authRoutes } from './auth/auth.router';
import { AuthService } from './auth/auth.service';
import type { BackgroundWork } from './auth/background-work';
import type { ClientLimits } from './auth/client-limits';
import type { HashGate } from './auth/hash-gate';
import { type Clock, systemClock } from './clock';
import type { Database } from './db/database';
import { healthRoutes } from './health/health.router';
import { apiNotFound, problemHandler } from './http/problem';
import { CALC_BASE_PATH, calcRegistry, calcRouter } from './calc/calc.router';
import { serveDocs } from './http/docs-serving';
import { securityHeaders } from './http/security-headers';
import { serveWorkbench } from './http/static-serving';
import { keyedMiddleware, keyedV1Router } from './http/v1';
import { API_KEY_SECURITY, KEYED_ROUTE_RESPONSES, keysRegistry } from './keys/keys.openapi';
import { ApiKeysRepo } from './keys/keys.repo';
import { keysRoutes } from './keys/keys.router';
import { ApiKeyService } from './keys/keys.service';
import { requireSecretKey, tokensRoutes } from './keys/tokens.router';
import { VisitorTokens } from './keys/visitor-tokens';
import type { Mailer } from './mail/mailer';
import { outboxRoutes } from './mail/outbox.router';
import { peopleRoutes } from './people/people.router';
import { PeopleService } from './people/people.service';
import { requirePermission, requireUser } from './auth/require-user';
import { ACCESS_TOKEN_SCHEME, ACCESS_TOKEN_SECURITY, SIGNED_IN_RESPONSES } from './openapi/responses';
import { can, type Permission, ROLES } from '@counterpoise/api';
import type { AccessRule, FeatureRoutes } from './http/route';
import { ChangeLog } from './records/change-log';
import type { RecordAccess } from './records/record-routes';
import { CustomersRepo } from './customers/customers.repo';
import { customersRouter } from './customers/customers.router';
import { CustomersService } from './customers/customers.service';
import { MachineFamiliesRepo } from './machine-families/machine-families.repo';
import { machineFamiliesRouter } from './machine-families/machine-families.router';
import { MachineFamiliesService } from './machine-families/machine-families.service';
import { MachinesRepo } from './machines/machines.repo';
import { machinesRouter } from './machines/machines.router';
import { MachinesService } from './machines/machines.service';
import { JobsRepo } from './jobs/jobs.repo';
import { jobsRouter } from './jobs/jobs.router';
import { JobsService } from './jobs/jobs.service';
import { ReportsRepo } from './reports/reports.repo';
import { reportsRouter } from './reports/reports.router';
import { ReportsService } from './reports/reports.service';
import { readingsImportRouter } from './readings-import/readings-import.router';
import { ReadingsImportService } from './readings-import/readings-import.service';
import { PhotoStore } from './photos/photo-store';
import { PhotosRepo } from './photos/photos.repo';
import { photosRouter } from './photos/photos.router';
import { PhotosService } from './photos/photos.service';
import { MachineHistoryRepo } from './machine-history/machine-history.repo';
import { machineHistoryRouter } from './machine-history/machine-history.router';
import { MachineHistoryService } from './machine-history/machine-history.service';
import { buildOpenApiDocument, openApiRouter } from './openapi/openapi';
import { UsageLog } from './usage/usage-log';
import { documentedPaths } from './usage/usage.recorder';
import { UsageRepo } from './usage/usage.repo';
import { usageRoutes } from './usage/usage.router';
import { VERSION } from './version';

/** What the app is built from; tests pass a temporary database and a fixed clock. */
export interface AppDeps {
  readonly database: Database;
  readonly clock?: Clock;
  readonly version?: string;
  /** The built workbench (`dist/workbench/browser`); the app is not served when absent. */
  readonly staticDir?: string;
  /** The built docs site (`dist/docs`), served at `/docs`; without it, every path there is a 404. */
  readonly docsDir?: string;
  /** Where photos are stored (`UPLOADS_DIR`); `uploads/` beside the database file when absent. */
  readonly uploadsDir?: string;
  readonly log?: (message: string, error?: unknown) => void;
  /**
   * The usage log of keyed requests. main.ts builds it so that it can `close()` it at shutdown, after
   * the server has finished its requests and before the database closes; without one, the app builds
   * its own (tests that make keyed requests pass theirs, to `flush()` it).
   */
  readonly usageLog?: UsageLog;
  /** Web origins whose pages may call `/api/v1` (CORS); none by default. */
  readonly corsOrigins?: readonly string[];
  /**
   * Every request reaches the server over HTTPS (a proxy ends TLS in front of it; `COOKIE_SECURE`):
   * send `Strict-Transport-Security` on every answer. Without it, only answers to requests that came
   * over HTTPS themselves carry it.
   */
  readonly secureTransport?: boolean;
  /** Express's `trust proxy`: which proxies in front may say who the client is (none by default). */
  readonly trustProxy?: boolean | number | string;
  /** Sign-in, people and e-mail; tests leave out what they do not need. */
  readonly accounts?: AccountsDeps;
}

/** What the accounts features are built from. */
export interface AccountsDeps {
  /** The HS256 key of access tokens; a random one per app when absent (tests). */
  readonly signingKey?: Uint8Array;
  /** scrypt's cost as a power of two; 15 by default, lower in tests. */
  readonly passwordHashCost?: number;
  /** Mark the refresh cookie `Secure`. */
  readonly secureCookie?: boolean;
  /** The workbench's address, for the links in e-mails. */
  readonly publicUrl?: string;
  /** Where invitations and reset links go; without one, sending fails with a clear error. */
  readonly mailer?: Mailer;
  /** Calculations per minute of a key created without a limit. */
  readonly defaultKeyLimitPerMinute?: number;
  /** Calculations per minute of a signed-in person on the calculator routes. */
  readonly userCalcLimitPerMinute?: number;
  /** Per-client-address limits of sign-in, resets and invitations; `DEFAULT_CLIENT_LIMITS` otherwise. */
  readonly clientLimits?: Partial<ClientLimits>;
  /** The gate of password hashes (how many at once, how many waiting); a default one when absent. */
  readonly hashGate?: HashGate;
  /** Where reset e-mails are sent after the answer; main.ts waits for it at shutdown, tests for mail. */
  readonly background?: BackgroundWork;
}

/** The mailer of an app built without one: it says why nothing can be sent. */
const NO_MAILER: Mailer = {
  send: () => Promise.reject(new Error('No mail transport is configured for this app.')),
};

/**
 * The access rule of a route for signed-in people whose role holds one of `permissions`: the guard, and
 * what the OpenAPI document says of it (the roles are read from the permission table, so they cannot
 * drift).
 */
function signedInAccess(auth: AuthService, ...permissions: [Permission, ...Permission[]]): AccessRule {
  const roles = ROLES.filter((role) => permissions.some((permission) => can(role, permission)));
  const held = permissions.map((permission) => `\`${permission}\``).join(' or ');
  return {
    guard: [requireUser(auth), requirePermission(...permissions)],
    security: ACCESS_TOKEN_SECURITY,
    responses: SIGNED_IN_RESPONSES,
    describe: `Signed-in people whose role holds ${held} (${roles.join(', ')}).`,
  };
}

/** The route of an invitation link: anyone may call it, the link's token is the credential. */
const INVITATION_LINK: AccessRule = { guard: [] };

/** Who may read, write and archive one kind of the shop's records. */
function recordAccess(auth: AuthService, write: Permission): Readonly<Record<RecordAccess, AccessRule>> {
  return {
    read: signedInAccess(auth, 'records:read'),
    write: signedInAccess(auth, write),
    archive: signedInAccess(auth, 'records:archive'),
  };
}

/**
 * Builds the Express app: the API under `/api`, its OpenAPI document and Swagger UI, and the workbench
 * with its client-side routes. It does not listen, so tests drive it with supertest.
 */
export function createApp(deps: AppDeps): Express {
  const clock = deps.clock ?? systemClock;
  const version = deps.version ?? VERSION;
  const log = deps.log ?? ((message, error) => console.error(message, error));

  const app = express();
  app.disable('x-powered-by');
  // No ETag on dynamic answers: almost all are POSTs or `no-store`, where it would only cost a hash of
  // every body. The workbench's files keep theirs (its static middleware sets its own).
  app.set('etag', false);
  app.set('query parser', 'simple');
  // The client's address counts sign-in and reset attempts: read it through the proxies configured only.
  app.set('trust proxy', deps.trustProxy ?? false);
  app.use(securityHeaders({ secureTransport: deps.secureTransport ?? false }));

  const accounts = deps.accounts ?? {};
  const mailer = accounts.mailer ?? NO_MAILER;
  const accountsRepo = new AccountsRepo(deps.database.orm);
  const signingKey = accounts.signingKey ?? randomBytes(48);
  const auth = new AuthService(
    accountsRepo,
    {
      signingKey,
      passwordCost: { log2N: accounts.passwordHashCost ?? 15 },
      secureCookie: accounts.secureCookie ?? false,
      publicUrl: accounts.publicUrl ?? 'http://localhost:4300',
    },
    clock,
    mailer,
    log,
    {
      ...(accounts.hashGate ? { hashGate: accounts.hashGate } : {}),
      ...(accounts.background ? { background: accounts.background } : {}),
    },
  );
  const keys = new ApiKeyService(new ApiKeysRepo(deps.database.orm));
  // Short-lived tokens a portal's back end exchanges its key for, one per visitor of its pages.
  const visitorTokens = new VisitorTokens(signingKey, clock);
  const clientLimits = accounts.clientLimits ?? {};

  // The workbench's routes, for signed-in people (and the public session routes): accounts first.
  const accountsFeatures: FeatureRoutes[] = [
    authRoutes(auth, { clientLimits }),
    peopleRoutes({
      auth,
      people: new PeopleService(accountsRepo, auth, clock, mailer),
      access: {
        read: signedInAccess(auth, 'people:read'),
        invite: signedInAccess(auth, 'people:invite'),
        // Owners hold people:manage; managers reach the service's narrower rule through people:invite.
        manage: signedInAccess(auth, 'people:manage', 'people:invite'),
        link: INVITATION_LINK,
      },
      clientLimits,
    }),
    keysRoutes({
      keys,
      clock,
      defaultLimitPerMinute: accounts.defaultKeyLimitPerMinute ?? 600,
      access: { manage: signedInAccess(auth, 'keys:manage') },
    }),
    outboxRoutes({ database: deps.database, access: { read: signedInAccess(auth, 'outbox:read') } }),
  ];
  // The shop's records, each change written to one change log.
  const recordChanges = new ChangeLog(deps.database.orm);
  const families = new MachineFamiliesService(
    new MachineFamiliesRepo(deps.database.orm),
    recordChanges,
    clock,
  );
  const machinesService = new MachinesService(new MachinesRepo(deps.database.orm), recordChanges, clock);
  // One jobs service for every feature that reads or changes jobs (reports, import, history).
  const jobsService = new JobsService(new JobsRepo(deps.database.orm), families, clock);
  const recordFeatures: FeatureRoutes[] = [
    customersRouter({
      access: recordAccess(auth, 'customers:write'),
      customers: new CustomersService(new CustomersRepo(deps.database.orm), recordChanges, clock),
    }),
    machineFamiliesRouter({
      access: recordAccess(auth, 'families:write'),
      families,
    }),
    machinesRouter({
      access: recordAccess(auth, 'machines:write'),
      machines: machinesService,
    }),
    // The balancing jobs; completing one refines its machine family's stored sensitivity.
    jobsRouter({
      access: {
        read: signedInAccess(auth, 'jobs:read'),
        write: signedInAccess(auth, 'jobs:write', 'jobs:write-any'),
        manage: signedInAccess(auth, 'jobs:write-any'),
      },
      jobs: jobsService,
    }),
    // The service report of a completed job: signed by the customer, frozen per revision, sent by e-mail.
    reportsRouter({
      access: {
        read: signedInAccess(auth, 'reports:read'),
        write: signedInAccess(auth, 'jobs:write', 'jobs:write-any'),
      },
      reports: new ReportsService(jobsService, new ReportsRepo(deps.database.orm), mailer, clock),
    }),
    // A job's run readings imported from a CSV file, through the jobs' service's own rules.
    readingsImportRouter({
      access: { write: signedInAccess(auth, 'jobs:write', 'jobs:write-any') },
      imports: new ReadingsImportService(deps.database.orm, jobsService),
    }),
    // A machine's job history and the CSV export of the shop's jobs, read through the jobs' service.
    machineHistoryRouter({
      access: {
        history: signedInAccess(auth, 'jobs:read'),
        export: signedInAccess(auth, 'reports:read'),
      },
      history: new MachineHistoryService(
        new MachineHistoryRepo(deps.database.orm),
        jobsService,
        machinesService,
        families,
      ),
    }),
    // Photos of machines and jobs, stored by content hash under the uploads folder.
    photosRouter({
      access: {
        readMachines: signedInAccess(auth, 'records:read'),
        writeMachines: signedInAccess(auth, 'machines:write'),
        readJobs: signedInAccess(auth, 'jobs:read'),
        writeJobs: signedInAccess(auth, 'jobs:write', 'jobs:write-any'),
        read: signedInAccess(auth, 'records:read', 'jobs:read'),
        change: signedInAccess(auth, 'machines:write', 'jobs:write'),
      },
      photos: new PhotosService(
        new PhotosRepo(deps.database.orm),
        new PhotoStore(deps.uploadsDir ?? uploadsBesideDatabase(deps.database)),
        clock,
      ),
    }),
  ];
  // The usage report sits behind the keyed chain, which has checked the key or the access token; its
  // guard is the chain's permission check.
  const usage = usageRoutes({
    repo: new UsageRepo(deps.database.orm),
    clock,
    access: {
      report: {
        guard: [requirePermission('usage:read')],
        security: [...API_KEY_SECURITY, { [ACCESS_TOKEN_SCHEME]: [] }],
        responses: KEYED_ROUTE_RESPONSES,
      },
    },
  });

  // The exchange of a secret key for a visitor token, behind the keyed chain like the usage report.
  const tokens = tokensRoutes({
    tokens: visitorTokens,
    access: {
      exchange: {
        guard: [requireSecretKey(keys)],
        security: API_KEY_SECURITY,
        responses: KEYED_ROUTE_RESPONSES,
      },
    },
  });

  const health = healthRoutes({ database: deps.database, clock, version });

  // The document of what this app built, in the order of the reference: built once, before the keyed
  // chain, whose usage recorder labels rows with its paths.
  const openApiDocument = buildOpenApiDocument(
    [
      health.registry,
      authRegistry,
      ...accountsFeatures.map((feature) => feature.registry),
      keysRegistry,
      tokens.registry,
      usage.registry,
      calcRegistry,
      ...recordFeatures.map((feature) => feature.registry),
    ],
    version,
  );
  app.locals.openApiDocument = openApiDocument;

  const usageLog = deps.usageLog ?? new UsageLog(deps.database, { log });
  const keyedDeps = {
    clock,
    usage: usageLog,
    corsOrigins: deps.corsOrigins ?? [],
    documentedPaths: documentedPaths(openApiDocument),
    keys,
    tokens: auth,
    visitorTokens,
    visitorTokenScope: CALC_BASE_PATH,
    ...(accounts.userCalcLimitPerMinute === undefined
      ? {}
      : { userLimitPerMinute: accounts.userCalcLimitPerMinute }),
  };
  // One keyed chain (key check, usage recorder, rate limit) for every keyed mount, so that a key's
  // requests are counted against one limit wherever they go.
  const keyed = keyedMiddleware(keyedDeps);

  // The calculator first: its requests are the busy ones, and pass through no other router. It answers
  // every path under it (404 for a route it does not have), so nothing falls through to be logged twice.
  // The keyed chain runs inside its one handler: one Express layer to match, not six.
  app.use(CALC_BASE_PATH, calcRouter({ before: [...keyed, requirePermission('calc:use')] }));

  // The signed-in routes, mounted ahead of the other keyed routes; a path they do not answer falls
  // through to them.
  const signedIn = Router();
  for (const feature of [...accountsFeatures, ...recordFeatures]) signedIn.use(feature.router);
  app.use('/api/v1', signedIn);

  // The usage report, and the key check of every other `/api/v1` path: a keyed request that no route
  // answers is still a logged request of its key, and then a 404 below.
  app.use('/api/v1', keyedV1Router({ ...keyedDeps, chain: keyed, routes: [usage.router, tokens.router] }));

  const api = Router();
  api.use(health.router);
  api.use(openApiRouter(openApiDocument));
  api.use(apiNotFound);
  app.use('/api', api);

  // The docs before the workbench: no page under /docs is ever the workbench's index.html.
  serveDocs(app, deps.docsDir);
  if (deps.staticDir) serveWorkbench(app, deps.staticDir);

  app.use(problemHandler(log));
  return app;
}

/** `uploads/` in the folder of the database file (a folder of its own under the system's for one in memory). */
function uploadsBesideDatabase(database: Database): string {
  const file = database.sqlite.name;
  if (file === ':memory:' || file === '') return join(tmpdir(), `counterpoise-uploads-${process.pid}`);
  return join(dirname(resolve(file)), 'uploads');
}
