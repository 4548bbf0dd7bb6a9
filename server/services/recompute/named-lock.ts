import type { DataSource, QueryRunner } from 'typeorm';

/** A MariaDB named lock held on its own connection; it ends when released or when the connection dies. */
export interface HeldLock {
  name: string;
  release: () => Promise<void>;
}

/**
 * Names are server-wide in MariaDB, so they carry the database name: two Cutline databases on one
 * server (e.g. test files) never block each other. At most 64 characters.
 */
export function recomputeLockName(ds: DataSource, programId: number): string {
  const database = String(ds.options.database ?? 'cutline');
  return `cutline:${database}:recompute:${programId}`.slice(0, 64);
}

/**
 * Takes `GET_LOCK(name, 0)` without waiting. The lock belongs to a connection taken out of the
 * pool for as long as it is held, so it holds across app instances and disappears with a killed
 * process. @returns null when another session holds it.
 */
export async function tryNamedLock(ds: DataSource, name: string): Promise<HeldLock | null> {
  const runner: QueryRunner = ds.createQueryRunner();
  try {
    const [row] = (await runner.query('SELECT GET_LOCK(?, 0) AS got', [name])) as Array<{ got: number | string | null }>;
    if (Number(row?.got) !== 1) {
      await runner.release();
      return null;
    }
  } catch (err) {
    await runner.release();
    throw err;
  }
  let released = false;
  return {
    name,
    release: async () => {
      if (released) return;
      released = true;
      await runner.query('SELECT RELEASE_LOCK(?)', [name]).catch(() => undefined);
      await runner.release();
    },
  };
}

/** Whether nobody holds the lock (a run marked `running` whose lock is free was interrupted). */
export async function isLockFree(ds: DataSource, name: string): Promise<boolean> {
  const [row] = (await ds.query('SELECT IS_FREE_LOCK(?) AS free', [name])) as Array<{ free: number | string | null }>;
  return Number(row?.free) === 1;
}
