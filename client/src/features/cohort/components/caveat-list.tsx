import { zodResolver } from '@hookform/resolvers/zod';
import type { CaveatAcknowledgementDto, CaveatDto, OutcomeResultDetailDto } from '@shared/api/results';
import { CaveatAcknowledgeSchema } from '@shared/schemas/caveat-acknowledgement';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { SeverityBadge } from '@/components/ui/severity-badge';
import { buttonPrimary, buttonSecondary, field, fieldError, fieldLabel } from '@/components/ui/styles';
import { ErrorState } from '@/components/ui/states';
import { formatDateTime } from '@/lib/format';
import { useAcknowledgeCaveat } from '../api/acknowledge-caveat';

const RANK = { serious: 0, caution: 1, info: 2 } as const;
const CommentSchema = CaveatAcknowledgeSchema.pick({ comment: true });

/** Every caveat of the result, most serious first, with the figures behind it and managers' acknowledgements. */
export function CaveatList({ result, period, programId, canAcknowledge, timeZone }: { result: OutcomeResultDetailDto; period: string; programId: number; canAcknowledge: boolean; timeZone: string }) {
  const caveats = [...result.caveats].sort((a, b) => RANK[a.severity] - RANK[b.severity]);
  if (caveats.length === 0) return <p className="text-sm text-ink-700">No caveats: the diagnostics found nothing that calls for care this month.</p>;
  return (
    <ul className="space-y-4" aria-label="Caveats">
      {caveats.map((c) => (
        <CaveatItem
          key={c.code}
          caveat={c}
          acks={(result.acknowledgements ?? []).filter((a) => a.caveatCode === c.code)}
          outcomeKey={result.outcome.key}
          resultId={result.id}
          period={period}
          programId={programId}
          canAcknowledge={canAcknowledge}
          timeZone={timeZone}
        />
      ))}
    </ul>
  );
}

function CaveatItem({ caveat, acks, outcomeKey, resultId, period, programId, canAcknowledge, timeZone }: { caveat: CaveatDto; acks: CaveatAcknowledgementDto[]; outcomeKey: string; resultId: number; period: string; programId: number; canAcknowledge: boolean; timeZone: string }) {
  const [open, setOpen] = useState(false);
  const values = Object.entries(caveat.values).filter(([, v]) => v !== null);
  return (
    <li className={`break-inside-avoid rounded-md bg-panel px-4 py-3 ${caveat.severity === 'serious' ? 'border-l-4 border-double border-serious' : caveat.severity === 'caution' ? 'border-l-4 border-dashed border-caution' : 'border-l-4 border-info'}`}>
      <div className="flex flex-wrap items-start gap-3">
        <SeverityBadge severity={caveat.severity} />
        <p className="flex-1 text-ink-900">{caveat.message}</p>
      </div>
      {values.length > 0 ? (
        <p className="figures mt-2 text-xs text-ink-500">
          Figures behind it: {values.map(([k, v]) => `${k} = ${typeof v === 'number' ? Number(v.toPrecision(4)) : String(v)}`).join(' · ')}
        </p>
      ) : null}
      {acks.length > 0 ? (
        <ul className="mt-3 space-y-1 border-t border-rule pt-2 text-sm" aria-label="Acknowledgements">
          {acks.map((a) => (
            <li key={a.id} className="text-ink-700">
              <span aria-hidden>✓ </span>
              Acknowledged by <span className="font-medium text-ink-900">{a.acknowledgedBy}</span>, {formatDateTime(a.acknowledgedAt, timeZone)}: “{a.comment}”
            </li>
          ))}
        </ul>
      ) : null}
      {canAcknowledge ? (
        open ? (
          <AcknowledgeForm programId={programId} period={period} resultId={resultId} outcomeKey={outcomeKey} caveatCode={caveat.code} onDone={() => setOpen(false)} />
        ) : (
          <button type="button" className={`${buttonSecondary} no-print mt-3`} onClick={() => setOpen(true)}>
            {acks.length > 0 ? 'Add another acknowledgement' : 'Acknowledge this caveat'}
          </button>
        )
      ) : null}
    </li>
  );
}

function AcknowledgeForm({ programId, period, resultId, outcomeKey, caveatCode, onDone }: { programId: number; period: string; resultId: number; outcomeKey: string; caveatCode: string; onDone: () => void }) {
  const mutation = useAcknowledgeCaveat(programId, period, resultId);
  const form = useForm<{ comment: string }>({ resolver: zodResolver(CommentSchema), defaultValues: { comment: '' } });
  const id = `ack-${outcomeKey}-${caveatCode}`;
  const submit = form.handleSubmit(async (values) => {
    await mutation.mutateAsync({ caveatCode, comment: values.comment });
    onDone();
  });
  return (
    <form className="no-print mt-3 space-y-2" onSubmit={(e) => void submit(e)} noValidate>
      <label htmlFor={id} className={fieldLabel}>
        Your comment (recorded with your name in the audit trail)
      </label>
      <textarea id={id} rows={3} className={field} autoFocus aria-invalid={form.formState.errors.comment ? true : undefined} {...form.register('comment')} />
      {form.formState.errors.comment ? <p className={fieldError}>{form.formState.errors.comment.message}</p> : null}
      {mutation.isError ? <ErrorState error={mutation.error} /> : null}
      <div className="flex gap-2">
        <button type="submit" className={buttonPrimary} disabled={mutation.isPending}>
          {mutation.isPending ? 'Saving…' : 'Acknowledge'}
        </button>
        <button type="button" className={buttonSecondary} onClick={onDone}>
          Cancel
        </button>
      </div>
    </form>
  );
}
