import { Cohort } from './cohort.entity';
import { CovariateDefinition } from './covariate-definition.entity';
import { CutoffChange } from './cutoff-change.entity';
import { OutcomeDefinition } from './outcome-definition.entity';
import { Program } from './program.entity';

/** Every entity, listed explicitly (TypeORM's glob loading does not work under vitest). Keep sorted. */
export const ENTITIES = [Cohort, CovariateDefinition, CutoffChange, OutcomeDefinition, Program];
