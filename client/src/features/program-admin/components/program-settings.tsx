import type { ProgramDetailDto } from '@shared/api/programs';
import { useUpdateProgram } from '../api/program-admin';
import { CutoffScheduleEditor } from './cutoff-schedule-editor';
import { CovariatesEditor, OutcomesEditor } from './definitions-editor';
import { Section } from './form-parts';
import { ProgramDetailsForm } from './program-details-form';

/** A program's settings: details, cutoff schedule, outcomes, covariates; each part saves on its own. */
export function ProgramSettings({ program }: { program: ProgramDetailDto }) {
  const update = useUpdateProgram(program.id);
  const { slug, name, description, scoreLabel, scoreUnit, scoreMin, scoreMax, eligibleSide, timeZone } = program;
  return (
    <>
      <Section title="Details">
        <ProgramDetailsForm
          initial={{ slug, name, description, scoreLabel, scoreUnit, scoreMin, scoreMax, eligibleSide, timeZone, populationLabel: program.populationLabel ?? 'applicants', takeUpPhrase: program.takeUpPhrase ?? 'take part' }}
          onSave={(v) => update.mutate(v)}
          saving={update.isPending}
          saved={update.isSuccess}
          error={update.error}
        />
      </Section>
      <Section title="Cutoff schedule" lead="The cutoff in force from each month on. The trend charts mark each change.">
        <CutoffScheduleEditor program={program} />
      </Section>
      <Section title="Outcomes" lead="What the program is meant to change. Yes/no outcomes use the unit “share”; their effects show in percentage points.">
        <OutcomesEditor program={program} />
      </Section>
      <Section title="Covariates" lead="Characteristics fixed before applying, such as household size. The balance check compares them either side of the cutoff.">
        <CovariatesEditor program={program} />
      </Section>
    </>
  );
}
