import { AuditEvent } from './audit-event.entity';
import { CaveatAcknowledgement } from './caveat-acknowledgement.entity';
import { ClusterCode } from './cluster-code.entity';
import { Cohort } from './cohort.entity';
import { CovariateDefinition } from './covariate-definition.entity';
import { CutoffChange } from './cutoff-change.entity';
import { DesignDeviation } from './design-deviation.entity';
import { DesignVersion } from './design-version.entity';
import { EmailMessage } from './email-message.entity';
import { EstimateResult } from './estimate-result.entity';
import { EstimateResultDetail } from './estimate-result-detail.entity';
import { EvaluationDesign } from './evaluation-design.entity';
import { Extract } from './extract.entity';
import { ExtractRejectedRow } from './extract-rejected-row.entity';
import { ExtractSource } from './extract-source.entity';
import { HttpSession } from './http-session.entity';
import { Observation } from './observation.entity';
import { OutcomeDefinition } from './outcome-definition.entity';
import { Program } from './program.entity';
import { RecomputeRun } from './recompute-run.entity';
import { RoleGrant } from './role-grant.entity';
import { SamlRequest } from './saml-request.entity';
import { SavedMapping } from './saved-mapping.entity';
import { SummarySubscription } from './summary-subscription.entity';
import { UsedAssertion } from './used-assertion.entity';
import { User } from './user.entity';

/** Every entity, listed explicitly (TypeORM's glob loading does not work under vitest). One a line, sorted. */
export const ENTITIES = [
  AuditEvent,
  CaveatAcknowledgement,
  ClusterCode,
  Cohort,
  CovariateDefinition,
  CutoffChange,
  DesignDeviation,
  DesignVersion,
  EmailMessage,
  EstimateResult,
  EstimateResultDetail,
  EvaluationDesign,
  Extract,
  ExtractRejectedRow,
  ExtractSource,
  HttpSession,
  Observation,
  OutcomeDefinition,
  Program,
  RecomputeRun,
  RoleGrant,
  SamlRequest,
  SavedMapping,
  SummarySubscription,
  UsedAssertion,
  User,
];
