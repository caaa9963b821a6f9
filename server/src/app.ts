import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { LOG_REDACT, LOG_SERIALIZERS } from './logger';
import type { Deps } from './http/context';
import type { JobQueue } from './jobs/queue';
import { apiNotFound, errorHandler } from './http/error-handler';
import { mountRoutes } from './http/route';
import { hostCheck } from './http/host-check';
import { serveClient } from './http/client-assets';
import { absoluteTimeout, buildPassport, buildSession, csrfProtection } from './http/security';
import { ActorCache } from './http/actor-cache';
import { healthRoutes } from './routes/health/health.router';
import { sessionRoutes } from './routes/session/session.router';
import { accountSecurityRoutes } from './routes/account-security/account-security.router';
import { organizationSignupRoutes } from './routes/organization-signup/organization-signup.router';
import { invitationRoutes } from './routes/invitations/invitations.router';
import { organizationRoutes } from './routes/organizations/organizations.router';
import { peopleRoutes } from './routes/people/people.router';
import { athleteRoutes } from './routes/athletes/athletes.router';
import { careTeamRoutes } from './routes/care-team/care-team.router';
import { guardianLinkRoutes } from './routes/guardian-links/guardian-links.router';
import { auditRoutes } from './routes/audit/audit.router';
import { caseRoutes } from './routes/cases/cases.router';
import { planRoutes } from './routes/plans/plans.router';
import { planTemplateRoutes } from './routes/plan-templates/plan-templates.router';
import { stageCriteriaRoutes } from './routes/stage-criteria/stage-criteria.router';
import { painReportRoutes } from './routes/pain-reports/pain-reports.router';
import { trainingRoutes } from './routes/training/training.router';
import { flagRoutes } from './routes/flags/flags.router';
import { notificationRoutes } from './routes/notifications/notifications.router';
import { noticePreferenceRoutes } from './routes/notice-preferences/notice-preferences.router';
import { exerciseRoutes } from './routes/programs/exercises.router';
import { programRoutes } from './routes/programs/programs.router';
import { exceptionRoutes } from './routes/programs/exceptions.router';
import { floorSheetRoutes } from './routes/team-programs/floor-sheet.router';
import { teamProgramRoutes } from './routes/team-programs/team-programs.router';
import { groupRoutes } from './routes/groups/groups.router';
import { injuryReportRoutes } from './routes/injury-report/injury-report.router';
import { rosterRoutes } from './routes/programs/roster.router';
import { rosterImportRoutes } from './routes/roster-imports/roster-imports.router';
import { letterRoutes } from './routes/letters/letters.router';
import { documentRoutes } from './routes/uploads/documents.router';
import { clipRoutes } from './routes/uploads/clips.router';
import { recordExportRoutes } from './routes/record-exports/record-exports.router';
import { calendarFeedRoutes } from './routes/exports/calendar-feed.router';
import { caseFhirRoutes } from './routes/exports/case-fhir.router';
import { createStorage } from './storage';
import type { ObjectStorage } from './storage';

const ROOT = path.resolve(import.meta.dirname, '../..');

export type AppDeps = Omit<Deps, 'passport' | 'jobs' | 'storage'> & { jobs?: JobQueue | null; storage?: ObjectStorage };

/** Builds the Express app (no listen). The returned `close` ends the app's own pools. */
export function buildApp(base: AppDeps) {
  const passport = buildPassport(base as Deps);
  const actorCache = new ActorCache(base.config.DATABASE_URL, base.logger, base.config.ACTOR_CACHE_SECONDS * 1000);
  const deps: Deps = {
    ...base,
    jobs: base.jobs ?? null,
    passport,
    storage: base.storage ?? createStorage(base.config),
    actorChanges: actorCache,
  };
  const { config } = deps;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.TRUST_PROXY === 'true' ? 1 : false);

  app.use(
    pinoHttp({
      logger: deps.logger,
      genReqId: (req, res) => {
        const incoming = req.headers['x-request-id'];
        const id = typeof incoming === 'string' && /^[\w-]{8,64}$/.test(incoming) ? incoming : randomUUID();
        res.setHeader('X-Request-Id', id);
        return id;
      },
      // Cookies, tokens, bodies and a failed query's values never reach the log (logger.ts), even when
      // the app is handed a logger that was not made by createLogger.
      redact: LOG_REDACT,
      serializers: LOG_SERIALIZERS,
      autoLogging: { ignore: (req) => req.url === '/api/health' },
    }),
  );
  // Before any handler, static files included: a request for another host is refused (http/host-check.ts).
  app.use(hostCheck(config));
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'"],
          fontSrc: ["'self'", 'data:'],
          imgSrc: ["'self'", 'data:', 'blob:'],
          mediaSrc: ["'self'", 'blob:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'none'"],
          frameAncestors: ["'none'"],
          formAction: ["'self'"],
        },
      },
      referrerPolicy: { policy: 'no-referrer' },
      strictTransportSecurity: config.SECURE_COOKIES === 'true',
    }),
  );

  const { middleware: sessionMiddleware, close: closeSessions } = buildSession(deps, actorCache);
  const api = Router();
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(express.json({ limit: '100kb' }));
  // The health check never needs a session: load balancers call it often and without cookies.
  const unlessHealth =
    (mw: express.RequestHandler): express.RequestHandler =>
    (req, res, next) =>
      req.path === '/health' ? next() : mw(req, res, next);
  api.use(unlessHealth(sessionMiddleware));
  api.use(unlessHealth(passport.initialize()));
  api.use(unlessHealth(passport.session()));
  api.use(absoluteTimeout(deps));
  api.use(csrfProtection());
  mountRoutes(api, deps, [
    ...healthRoutes,
    ...sessionRoutes(deps),
    ...accountSecurityRoutes(deps),
    ...invitationRoutes(deps),
    ...organizationSignupRoutes(deps),
    ...organizationRoutes,
    ...peopleRoutes,
    ...athleteRoutes,
    ...careTeamRoutes,
    ...guardianLinkRoutes,
    ...auditRoutes,
    ...caseRoutes,
    ...planRoutes,
    ...planTemplateRoutes,
    ...stageCriteriaRoutes,
    ...painReportRoutes,
    ...trainingRoutes,
    ...flagRoutes,
    ...notificationRoutes,
    ...noticePreferenceRoutes,
    ...exerciseRoutes,
    ...programRoutes,
    ...exceptionRoutes,
    ...teamProgramRoutes,
    ...floorSheetRoutes,
    ...groupRoutes,
    ...injuryReportRoutes,
    ...rosterRoutes,
    ...rosterImportRoutes,
    ...letterRoutes(deps),
    ...documentRoutes,
    ...clipRoutes,
    ...recordExportRoutes,
    ...calendarFeedRoutes(deps),
    ...caseFhirRoutes,
  ]);
  api.use(apiNotFound);
  app.use('/api', api);

  const clientDist = config.CLIENT_DIST ?? path.join(ROOT, 'client', 'dist');
  if (existsSync(path.join(clientDist, 'index.html'))) {
    serveClient(app, clientDist);
  } else {
    app.get('/', (_req, res) => {
      res.type('text/plain').send('Loadline API is running. The client is not built: run `npm start` (or `npm run dev` for development).');
    });
  }
  app.use(errorHandler(deps));

  // `ready`: the actor cache listens for changes (until then it is off, and every request reads afresh).
  return { app, ready: actorCache.start(), actorCache, close: closeSessions };
}
