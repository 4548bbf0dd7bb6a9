import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import type { Config } from './config/env';
import type { Logger } from './lib/logger';
import type { ProgramVisibility } from './services/programs.service';

/** What routes and services need from the running app; built once by `createApp`'s caller. */
export interface AppContext {
  config: Config;
  dataSource: DataSource;
  logger: Logger;
  /** Programs the request's user may see (the sign-in module narrows this to their grants). */
  visiblePrograms: (req: Request) => ProgramVisibility;
}
