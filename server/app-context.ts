import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import type { IdentityProviderSettings } from './auth/identity-provider';
import type { Config } from './config/env';
import type { Logger } from './lib/logger';
import type { ProgramVisibility } from './services/programs.service';

/** What routes and services need from the running app; built once by `createApp`'s caller. */
export interface AppContext {
  config: Config;
  dataSource: DataSource;
  logger: Logger;
  /** The identity provider people sign in with (the agency's, or the local stand-in). */
  identityProvider: IdentityProviderSettings;
  /** Programs the request's user may see: `visibleProgramsOf` (`server/auth/access-enforcer.ts`) in the real app. */
  visiblePrograms: (req: Request) => ProgramVisibility;
}
