import express from 'express';
import helmet from 'helmet';
import type { Knex } from 'knex';
import { Model } from 'objection';
import { JSON_BODY_LIMIT_BYTES } from '../shared/schemas/limits';
import type { AppContext } from './app-context';
import { createCsrf } from './auth/csrf';
import { createPassport } from './auth/passport';
import { createSessionMiddleware } from './auth/session';
import type { ServerConfig } from './config';
import { createFileStore } from './files/file-store';
import { apiNotFound, errorHandler } from './http/error-handler';
import { mountRoutes, type AnyRouteSpec } from './http/route';
import { webAppRouter } from './http/web-app';
import { logError } from './log';
import type { Mailer } from './mail/mailer';
import { buildOpenApiDocument } from './openapi/openapi-document';
import { accountRoutes } from './routes/account/account-routes';
import { authRoutes } from './routes/auth/auth-routes';
import { mailSinkRoutes } from './routes/mail-sink/mail-sink-routes';
import { sampleCsvRoutes } from './routes/samples/sample-csv-routes';
import { sampleRoutes } from './routes/samples/sample-routes';
import { stepTemplateRoutes } from './routes/step-templates/step-template-routes';
import { stepRoutes } from './routes/steps/step-routes';
import { storageRoutes } from './routes/storage/storage-routes';
import { labelRoutes } from './routes/labels/label-routes';
import { auditRoutes } from './routes/audits/audit-routes';
import { deviceRoutes } from './routes/devices/device-routes';
import { shareLinkRoutes } from './routes/share-links/share-link-routes';
import { calibrationRoutes } from './routes/evidence/calibration-routes';
import { evidenceRoutes } from './routes/evidence/evidence-routes';
import { fileRoutes } from './routes/evidence/file-routes';
import { systemRoutes } from './routes/system/system-routes';
import { userRoutes } from './routes/users/user-routes';

/** Every API route, in one list: the router, the OpenAPI document and the access tests read it. */
export function apiRouteSpecs(context: AppContext): AnyRouteSpec[] {
  const specs: AnyRouteSpec[] = [
    ...authRoutes(context),
    ...accountRoutes(context),
    ...userRoutes(context),
    ...mailSinkRoutes(context),
    ...sampleCsvRoutes(context),
    ...sampleRoutes(context),
    ...stepRoutes(context),
    ...stepTemplateRoutes(context),
    ...storageRoutes(context),
    ...labelRoutes(context),
    ...deviceRoutes(context),
    ...auditRoutes(context),
    ...shareLinkRoutes(context),
    ...evidenceRoutes(context),
    ...fileRoutes(context),
    ...calibrationRoutes(context),
  ];
  let document: unknown;
  const system = systemRoutes(context, () => (document ??= buildOpenApiDocument(all, context.config.publicBaseUrl)));
  const all = [...system, ...specs];
  return all;
}

export function createApp(deps: { config: ServerConfig; knex: Knex; mailer: Mailer }) {
  const { config } = deps;
  // Models without an explicit transaction use the server's knex.
  Model.knex(deps.knex);
  const context: AppContext = {
    ...deps,
    passport: createPassport(),
    csrf: createCsrf(),
    files: createFileStore(config.storage),
  };
  const session = createSessionMiddleware(config);
  const specs = apiRouteSpecs(context);

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy ? 1 : false);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          // The web QR scanner compiles its WebAssembly decoder (served from our origin).
          scriptSrc: ["'self'", "'wasm-unsafe-eval'"],
          baseUri: ["'self'"],
          frameAncestors: ["'none'"],
          // react-native-web writes its styles at run time.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
        },
      },
      frameguard: { action: 'deny' },
    }),
  );

  const api = express.Router();
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(express.json({ limit: JSON_BODY_LIMIT_BYTES }));
  api.use(session.middleware);
  api.use(context.passport.initialize());
  api.use(context.passport.session());
  api.use(context.csrf.protect);
  mountRoutes(api, specs);
  api.use(apiNotFound);
  api.use(errorHandler(logError));

  app.use('/api', api);
  app.use(webAppRouter(config.webDistDir));

  return { app, specs, close: session.close };
}
