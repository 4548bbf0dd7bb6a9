import fs from 'node:fs';
import path from 'node:path';
import { DataSource } from 'typeorm';
import { loadConfig, REPO_ROOT } from '../config/env';
import { ENTITIES } from '../entities';
import { MIGRATIONS } from '../migrations';
import { SnakeNamingStrategy } from '../db/naming-strategy';
import { devDatabaseServer } from './database';
import { prepareLocalEnv } from './local-env';

/**
 * `npm run migration:generate -- PascalName`: applies the existing migrations to a scratch database
 * on the private server, asks TypeORM for the difference to the entities, and writes it as a new
 * migration under server/migrations/. Read the file, then add the class to migrations/index.ts.
 */
async function main(name: string | undefined): Promise<void> {
  if (!name || !/^[A-Z][A-Za-z0-9]+$/.test(name)) throw new Error('Give the migration a PascalCase name, e.g. AddExtracts.');
  prepareLocalEnv();
  const config = loadConfig();
  const server = devDatabaseServer(config);
  await server.start({ detached: true });
  const scratch = 'cutline_migration_scratch';
  const admin = new DataSource({ type: 'mariadb', extra: { socketPath: server.socket }, username: 'root' });
  await admin.initialize();
  await admin.query(`DROP DATABASE IF EXISTS ${scratch}`);
  await admin.query(`CREATE DATABASE ${scratch} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.destroy();
  const ds = new DataSource({
    type: 'mariadb',
    extra: { socketPath: server.socket },
    username: 'root',
    database: scratch,
    charset: 'utf8mb4_unicode_ci',
    entities: ENTITIES,
    migrations: MIGRATIONS,
    namingStrategy: new SnakeNamingStrategy(),
  });
  await ds.initialize();
  try {
    await ds.runMigrations();
    const sql = await ds.driver.createSchemaBuilder().log();
    if (sql.upQueries.length === 0) {
      console.log('The migrations already match the entities; nothing to write.');
      return;
    }
    const stamp = Date.now();
    const quote = (q: string) => '`' + q.replace(/\\/g, '\\\\').replace(/`/g, '\\`').replace(/\$\{/g, '\\${') + '`';
    const up = sql.upQueries.map((q) => `    await queryRunner.query(${quote(q.query)});`).join('\n');
    const down = [...sql.downQueries].reverse().map((q) => `    await queryRunner.query(${quote(q.query)});`).join('\n');
    const file = path.join(REPO_ROOT, 'server', 'migrations', `${stamp}-${name}.ts`);
    fs.writeFileSync(
      file,
      `import type { MigrationInterface, QueryRunner } from 'typeorm';\n\nexport class ${name}${stamp} implements MigrationInterface {\n  name = '${name}${stamp}';\n\n  async up(queryRunner: QueryRunner): Promise<void> {\n${up}\n  }\n\n  async down(queryRunner: QueryRunner): Promise<void> {\n${down}\n  }\n}\n`,
    );
    registerMigration(`${name}${stamp}`, `${stamp}-${name}`);
    console.log(`Wrote ${path.relative(REPO_ROOT, file)} and listed it in server/migrations/index.ts. Read it before committing.`);
  } finally {
    await ds.query(`DROP DATABASE IF EXISTS ${scratch}`);
    await ds.destroy();
  }
}

/** Adds the import and the array entry to migrations/index.ts. */
function registerMigration(className: string, fileName: string): void {
  const indexFile = path.join(REPO_ROOT, 'server', 'migrations', 'index.ts');
  const lines = fs.readFileSync(indexFile, 'utf8').split('\n');
  const lastImport = lines.findLastIndex((l) => l.startsWith('import '));
  lines.splice(lastImport + 1, 0, `import { ${className} } from './${fileName}';`);
  const close = lines.findLastIndex((l) => l === '];');
  lines.splice(close, 0, `  ${className},`);
  fs.writeFileSync(indexFile, lines.join('\n'));
}

main(process.argv[2]).catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exitCode = 1;
});
