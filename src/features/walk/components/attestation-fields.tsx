import { CheckboxField, SelectField, TextField } from '../../../components/ui/field';
import { ATTESTATION_BASES, ATTESTATION_STATEMENTS, Attestation } from '../../../shared/api/systems';

export interface AttestationDraft {
  name: string;
  licenceNumber: string;
  basis: (typeof ATTESTATION_BASES)[number];
  confirmed: boolean;
}

export const EMPTY_ATTESTATION: AttestationDraft = { name: '', licenceNumber: '', basis: 'prepared', confirmed: false };

const BASIS_OPTIONS = [
  { value: 'prepared', label: 'I prepared it' },
  { value: 'supervised', label: 'It was prepared under my direct supervision' },
];

/** The attestation as the API takes it, or null while a field is missing (the shared schema decides). */
export function attestationOf(draft: AttestationDraft): Attestation | null {
  const parsed = Attestation.safeParse(draft);
  return parsed.success ? parsed.data : null;
}

/**
 * The preparer's attestation, asked when a revision is issued: their name and licence or
 * registration number as printed on the summary, and the statement they confirm. Headroom records
 * it with the time on the revision; the summary prints it beside an empty signature field.
 */
export function AttestationFields({ value, onChange, disabled }: { value: AttestationDraft; onChange: (next: AttestationDraft) => void; disabled?: boolean }) {
  const set = (patch: Partial<AttestationDraft>) => onChange({ ...value, ...patch });
  return (
    <fieldset className="flex flex-col gap-3" aria-label="Attestation" disabled={disabled}>
      <legend className="font-semibold">Attestation</legend>
      <div className="grid gap-3 md:grid-cols-2">
        <TextField label="Your name, as on your licence" autoComplete="name" value={value.name} onChange={(ev) => set({ name: ev.target.value })} />
        <TextField
          label="Licence or registration number"
          autoComplete="off"
          value={value.licenceNumber}
          onChange={(ev) => set({ licenceNumber: ev.target.value })}
        />
      </div>
      <SelectField
        label="This calculation"
        options={BASIS_OPTIONS}
        value={value.basis}
        onChange={(ev) => set({ basis: ev.target.value as AttestationDraft['basis'] })}
      />
      <CheckboxField
        label={`I confirm: “${ATTESTATION_STATEMENTS[value.basis]}”`}
        hint="Recorded with the time on this revision and printed on its summary, beside an empty signature field you can sign with your own certificate."
        checked={value.confirmed}
        onChange={(ev) => set({ confirmed: ev.target.checked })}
      />
    </fieldset>
  );
}
