import { Router } from 'express';
import { curveJsonSchema } from '../../shared/curve';

/**
 * Public, machine-readable formats: the curve document's JSON Schema (generated from the shared zod
 * schema, the same text as docs/curve.schema.json), for engine teams and validators.
 */
export function schemasRoutes(): Router {
  const router = Router();
  const curveSchema = JSON.stringify(curveJsonSchema(), null, 2);
  router.get('/schemas/curve.schema.json', (_req, res) => {
    res.set('Cache-Control', 'public, max-age=300');
    res.type('application/schema+json').send(curveSchema);
  });
  return router;
}
