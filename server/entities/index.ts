import { AuditEvent } from './audit-event.entity';
import { Cohort } from './cohort.entity';
import { CovariateDefinition } from './covariate-definition.entity';
import { CutoffChange } from './cutoff-change.entity';
import { HttpSession } from './http-session.entity';
import { OutcomeDefinition } from './outcome-definition.entity';
import { Program } from './program.entity';
import { RoleGrant } from './role-grant.entity';
import { SamlRequest } from './saml-request.entity';
import { UsedAssertion } from './used-assertion.entity';
import { User } from './user.entity';

/** Every entity, listed explicitly (TypeORM's glob loading does not work under vitest). One a line, sorted. */
export const ENTITIES = [
  AuditEvent,
  Cohort,
  CovariateDefinition,
  CutoffChange,
  HttpSession,
  OutcomeDefinition,
  Program,
  RoleGrant,
  SamlRequest,
  UsedAssertion,
  User,
];
