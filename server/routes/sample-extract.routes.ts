import { Router } from 'express';
import { DEMO_PROGRAM } from '@shared/demo/heating-credit';
import { REGIONAL_OFFICE_PERIOD, writeRegionalOfficeWorkbook } from '../demo/demo-files';
import { Program } from '../entities/program.entity';
import { allow } from '../http/access';
import { idParam } from '../http/validate';
import { notFound } from '../lib/errors';
import type { AppContext } from '../app-context';

/** The demo program's sample workbook (a regional office's month, invented), for trying an upload by hand. */
export function sampleExtractRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/programs/:programId/sample-extract.xlsx', allow({ kind: 'roles', roles: ['analyst'], scope: 'program' }), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    const program = await ctx.dataSource.getRepository(Program).findOneBy({ id: programId });
    if (!program || program.slug !== DEMO_PROGRAM.slug) throw notFound('A sample workbook for this program');
    res.setHeader('Content-Type', 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    res.setHeader('Content-Disposition', `attachment; filename="regional-office-${REGIONAL_OFFICE_PERIOD}.xlsx"`);
    await writeRegionalOfficeWorkbook(res);
  });
  return router;
}
