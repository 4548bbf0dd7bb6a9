import fs from 'node:fs';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { DEMO_COVARIATES, DEMO_CUTOFF_SCHEDULE, DEMO_OUTCOMES, DEMO_PROGRAM, demoPeriods } from '@shared/demo/heating-credit';
import { DEMO_PEOPLE } from '@shared/demo/people';
import { loadConfig, type Config } from '../config/env';
import { CovariateDefinition } from '../entities/covariate-definition.entity';
import { CutoffChange } from '../entities/cutoff-change.entity';
import { Extract } from '../entities/extract.entity';
import { ExtractSource } from '../entities/extract-source.entity';
import { OutcomeDefinition } from '../entities/outcome-definition.entity';
import { Program } from '../entities/program.entity';
import { RoleGrant } from '../entities/role-grant.entity';
import { User } from '../entities/user.entity';
import { createLogger, type Logger } from '../lib/logger';
import { SYSTEM_ACTOR } from '../services/audit.service';
import { createDataSource as createExtractSource, saveMapping } from '../services/data-sources.service';
import { acceptExtract } from '../services/extract-decisions.service';
import { receiveExtract } from '../services/extract-upload.service';
import { findExtract } from '../services/extracts.service';
import { headerColumns, headerFingerprint } from '../services/ingest/header';
import { ingestWorker } from '../services/ingest/ingest-worker';
import { ingestFiles } from '../services/ingest/work-dir';
import { CASE_MANAGEMENT_HEADER, CASE_MANAGEMENT_MAPPING, CASE_MANAGEMENT_SOURCE, REGIONAL_OFFICE_PERIOD, writeCaseManagementCsv, writeRegionalOfficeWorkbook } from './demo-files';

/**
 * Installs the invented demo program and the demo people with their grants (each person once: an
 * administrator's later changes are kept), then loads its 24 monthly case-management exports through the
 * real ingest path (upload, saved mapping recognised, validation, accept by the system actor,
 * LOAD DATA and the swap), and writes a regional office's workbook to var/demo/ for trying an upload
 * by hand. Resumes where it stopped if interrupted; a second run does nothing.
 * @returns whether anything was installed (false when every demo month was already loaded).
 */
export async function installDemoScenario(
  ds: DataSource,
  options: { config?: Config; logger?: Logger; log?: (line: string) => void } = {},
): Promise<{ installed: boolean; programId: number }> {
  const config = options.config ?? loadConfig();
  const deps = { dataSource: ds, config, logger: options.logger ?? createLogger(config.logLevel) };
  const existing = await ds.getRepository(Program).findOneBy({ slug: DEMO_PROGRAM.slug });
  const programId = existing?.id ?? (await createDemoProgram(ds));
  await installDemoPeople(ds, programId);
  const loaded = new Set(
    (await ds.getRepository(Extract).find({ where: { programId }, select: { period: true, status: true } }))
      .filter((e) => e.status === 'accepted' || e.status === 'superseded')
      .map((e) => e.period),
  );
  const missing = demoPeriods().filter((p) => !loaded.has(p));
  if (missing.length === 0) return { installed: false, programId };

  const sourceId = await ensureCaseManagementSource(ds, programId);
  options.log?.(`Loading ${missing.length} monthly demo extract(s) through the ingest path…`);
  const worker = ingestWorker(deps);
  for (const period of missing) {
    const file = path.join(ingestFiles(deps).incoming(), `demo-${period}.csv`);
    writeCaseManagementCsv(file, period);
    const { extract } = await receiveExtract(deps, programId, SYSTEM_ACTOR, { path: file, originalName: `case-management-${period}.csv` }, { period, sourceId, reviewMapping: false });
    await worker.idle();
    const checked = await findExtract(ds, programId, extract.id);
    if (checked.status !== 'awaiting-decision' || checked.problemCode) {
      throw new Error(`The demo extract for ${period} did not pass validation (${checked.problemCode ?? checked.status}).`);
    }
    await acceptExtract(deps, programId, extract.id, SYSTEM_ACTOR, 'Demo scenario');
    await worker.idle();
  }
  await writeDemoWorkbook(config.varDir);
  return { installed: true, programId };
}

async function createDemoProgram(ds: DataSource): Promise<number> {
  return ds.transaction(async (tx) => {
    const program = await tx.getRepository(Program).save(tx.getRepository(Program).create(DEMO_PROGRAM));
    await tx.getRepository(CutoffChange).insert(DEMO_CUTOFF_SCHEDULE.map((c) => ({ ...c, programId: program.id })));
    await tx.getRepository(OutcomeDefinition).insert(DEMO_OUTCOMES.map((o, i) => ({ ...o, programId: program.id, position: i + 1 })));
    await tx.getRepository(CovariateDefinition).insert(DEMO_COVARIATES.map((c, i) => ({ ...c, programId: program.id, position: i + 1 })));
    return program.id;
  });
}

/** The "Case-management export" data source with its saved mapping, so each month maps itself. */
async function ensureCaseManagementSource(ds: DataSource, programId: number): Promise<number> {
  const found = await ds.getRepository(ExtractSource).findOneBy({ programId, name: CASE_MANAGEMENT_SOURCE });
  if (found) return found.id;
  return ds.transaction(async (tx) => {
    const source = await createExtractSource(tx, programId, CASE_MANAGEMENT_SOURCE);
    const columns = headerColumns(CASE_MANAGEMENT_HEADER);
    await saveMapping(tx, { programId, sourceId: source.id, fingerprint: headerFingerprint(columns), columns, mapping: CASE_MANAGEMENT_MAPPING, actor: SYSTEM_ACTOR });
    return source.id;
  });
}

/** var/demo/regional-office-2026-11.xlsx: upload it by hand to meet the mapping form. */
async function writeDemoWorkbook(varDir: string): Promise<void> {
  const dir = path.join(varDir, 'demo');
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `regional-office-${REGIONAL_OFFICE_PERIOD}.xlsx`);
  if (fs.existsSync(file)) return;
  await writeRegionalOfficeWorkbook(fs.createWriteStream(file));
}

/** The demo people (`shared/demo/people.ts`), each with their one grant, unless they exist already. */
async function installDemoPeople(ds: DataSource, programId: number): Promise<void> {
  await ds.transaction(async (tx) => {
    for (const person of DEMO_PEOPLE) {
      if (await tx.getRepository(User).existsBy({ email: person.email })) continue;
      const user = await tx.getRepository(User).save(
        tx.getRepository(User).create({ email: person.email, displayName: person.displayName, nameId: null, active: true, lastSignInAt: null }),
      );
      await tx.getRepository(RoleGrant).insert({
        userId: user.id,
        role: person.role,
        programId: person.scope === 'agency' ? null : programId,
        source: 'admin',
        groupName: null,
        grantedByUserId: null,
      });
    }
  });
}
