import type { MigrationInterface } from 'typeorm';
import { InitialSchema1796180845907 } from './1796180845907-InitialSchema';
import { AddAuditTrail1796181110234 } from './1796181110234-AddAuditTrail';
import { AddSignIn1796181746557 } from './1796181746557-AddSignIn';
import { AddDesignsRunsResultsMail1796182794875 } from './1796182794875-AddDesignsRunsResultsMail';
import { AddProgramWords1796187181992 } from './1796187181992-AddProgramWords';
import { AddExtracts1796189192848 } from './1796189192848-AddExtracts';

type MigrationClass = new () => MigrationInterface;

/** Every migration in order. `npm run migration:generate -- Name` writes a new file and lists it here. */
export const MIGRATIONS: MigrationClass[] = [
  InitialSchema1796180845907,
  AddAuditTrail1796181110234,
  AddSignIn1796181746557,
  AddDesignsRunsResultsMail1796182794875,
  AddProgramWords1796187181992,
  AddExtracts1796189192848,
];
