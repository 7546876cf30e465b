import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { CLIENT_IP_HEADER } from './auth.ts';
import { Api } from './http/route.ts';
import { sessionMiddleware } from './middleware/session.ts';
import { originCheck } from './middleware/origin-check.ts';
import { apiNotFound, errorHandler, notFound } from './middleware/error-handler.ts';
import { authHandler } from './http/auth-handler.ts';
import { logSerializers } from './logger.ts';
import { noStore } from './middleware/no-store.ts';
import { NotFoundError } from './errors.ts';
import { systemRoutes } from './routes/system.ts';
import { userRoutes } from './routes/users.ts';
import { partRoutes } from './routes/parts.ts';
import { stackPlanRoutes } from './routes/stack-plans.ts';
import { stockRoutes } from './routes/stock.ts';
import { jobRoutes } from './routes/jobs.ts';
import { mailRoutes } from './routes/mail.ts';
import { paymentRoutes, paymentWebhookRoute } from './routes/payments.ts';
import { portalRoutes } from './routes/portal.ts';
import { warehouseRoutes } from './routes/warehouse.ts';
import { purchasingRoutes } from './routes/purchasing.ts';
import { createServices, type AppDeps, type AppOptions } from './deps.ts';

export { createServices, type AppDeps, type AppOptions };

/** The Express app. Pass `deps` to share services with the caller (tests arrange data through the app's own). */
export function createApp(options: AppOptions, deps: AppDeps = createServices(options)) {
  const app = express();
  app.disable('x-powered-by');
  // Forwarded addresses are believed only when TRUST_PROXY names the hops that set them (e.g. 1 or
  // the balancer's address); by default nobody may tell us the client's address, loopback included.
  app.set('trust proxy', options.trustProxy ?? false);

  app.use(
    pinoHttp({
      logger: options.logger,
      genReqId: (req, res) => {
        const id = randomUUID();
        res.setHeader('x-request-id', id);
        return id;
      },
      customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
      autoLogging: { ignore: (req) => req.url === '/api/health' },
      serializers: logSerializers,
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: { 'img-src': ["'self'", 'data:', 'blob:'], 'upgrade-insecure-requests': null },
      },
      strictTransportSecurity: false,
    }),
  );

  // better-auth reads the raw body itself, so it is mounted before the JSON parser.
  // Our origin check runs first: the library only checks origins when cookies are present,
  // which would let another site sign a visitor in to an account of its choosing.
  app.use('/api/auth', noStore, originCheck(options.trustedOrigins), (req, _res, next) => {
    req.headers[CLIENT_IP_HEADER] = req.ip ?? req.socket.remoteAddress ?? 'unknown';
    // Signing out (here or everywhere) must take effect at once, not when remembered sessions expire.
    if (req.method !== 'GET' && !req.path.startsWith('/sign-in')) deps.sessionCache.clear();
    next();
  });
  // The library's own admin routes would bypass the company rules: /api/admin/users (services/users.ts)
  // calls the same admin API in-process with those rules, so over HTTP they do not exist.
  app.all(['/api/auth/admin', '/api/auth/admin/{*any}'], (_req, _res, next) => next(new NotFoundError('That page')));
  app.all('/api/auth/{*any}', authHandler(options.auth));
  app.use('/api/auth', errorHandler);

  const router = Router();
  const api = new Api(router);
  router.use(noStore, originCheck(options.trustedOrigins));
  // Before the JSON parser: the provider signs the raw bytes.
  paymentWebhookRoute(api, deps);
  router.use(express.json({ limit: '1mb' }));
  router.use(sessionMiddleware(options.auth, deps.sessionCache));
  systemRoutes(api, deps);
  userRoutes(api, deps);
  partRoutes(api, deps);
  stackPlanRoutes(api, deps);
  stockRoutes(api, deps);
  jobRoutes(api, deps);
  mailRoutes(api, deps);
  paymentRoutes(api, deps);
  portalRoutes(api, deps);
  warehouseRoutes(api, deps);
  purchasingRoutes(api, deps);
  // Routes are fixed once the app is built, so the document is generated once.
  let openapi: unknown;
  router.get('/openapi.json', (_req, res) => {
    openapi ??= api.document();
    res.setHeader('cache-control', 'no-cache'); // no user data: clients may keep it and revalidate
    res.json(openapi);
  });
  router.use(apiNotFound);
  router.use(errorHandler);
  app.use('/api', router);

  if (options.clientDir && existsSync(path.join(options.clientDir, 'index.html'))) {
    const dir = options.clientDir;
    app.use('/assets', express.static(path.join(dir, 'assets'), { immutable: true, maxAge: '1y', fallthrough: false }));
    app.use(express.static(dir, { index: false, maxAge: '1h' }));
    app.get('/{*any}', (_req, res) => {
      res.setHeader('cache-control', 'no-cache');
      res.sendFile(path.join(dir, 'index.html'));
    });
  }
  app.use(notFound);
  app.use(errorHandler);
  return app;
}
