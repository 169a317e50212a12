import { Router } from 'express';
import swaggerUi from 'swagger-ui-express';
import { buildOpenApiDocument } from './document';

/** `/api/openapi.json` and the browsable `/api/docs` page (Swagger UI's assets served from node_modules). */
export function openApiRouter(): Router {
  const router = Router();
  router.get('/openapi.json', (_req, res) => {
    res.json(buildOpenApiDocument());
  });
  router.use('/docs', swaggerUi.serveFiles(undefined, { swaggerUrl: '/api/openapi.json' }), swaggerUi.setup(undefined, {
    customSiteTitle: 'Ohmprint API',
    customCss: '',
    swaggerUrl: '/api/openapi.json',
    swaggerOptions: { url: '/api/openapi.json' },
  }));
  return router;
}
