import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { SelectField, TextField } from '../../../components/Field';
import { ErrorNotice } from '../../../components/Notice';
import { sigmaLabel } from '../../../components/plot/theme';
import { isApiError } from '../../../lib/http';
import { useCreateLayerSet, useUpdateLayerSet } from '../api';
import { REFERENCE_PRESSURES, validateLayerSet, type LayerSet, type LayerSetInput } from '../types';
import { LevelsField } from './LevelsField';

/** Create a layer set, or edit one (`editing`). Errors inline: ours before sending, the server's after. */
export function LayerSetForm({
  cruiseId,
  editing,
  onDone,
}: {
  cruiseId: string;
  editing?: LayerSet | null;
  onDone?: () => void;
}) {
  const [input, setInput] = useState<LayerSetInput>(() =>
    editing
      ? { name: editing.name, referencePressure: editing.referencePressure, levels: editing.levels }
      : { name: '', referencePressure: 0, levels: '' },
  );
  const [errors, setErrors] = useState<Partial<Record<keyof LayerSetInput, string>>>({});
  const [sent, setSent] = useState(false);
  const create = useCreateLayerSet(cruiseId);
  const update = useUpdateLayerSet(cruiseId);
  const mutation = editing ? update : create;
  const serverFields = sent && isApiError(mutation.error, 400) ? mutation.error.fieldErrors() : {};

  const change = <K extends keyof LayerSetInput>(key: K, value: LayerSetInput[K]) => {
    setInput((v) => ({ ...v, [key]: value }));
    setErrors((e) => ({ ...e, [key]: undefined }));
    setSent(false);
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found = validateLayerSet(input);
    setErrors(found);
    if (Object.keys(found).length > 0) return;
    setSent(true);
    const body = { ...input, name: input.name.trim(), levels: input.levels.trim() };
    const done = () => {
      if (!editing) setInput({ name: '', referencePressure: input.referencePressure, levels: '' });
      setSent(false);
      onDone?.();
    };
    if (editing) update.mutate({ id: editing.id, ...body }, { onSuccess: done });
    else create.mutate(body, { onSuccess: done });
  };

  const showGeneral =
    sent && mutation.isError && !(isApiError(mutation.error, 400) && Object.keys(serverFields).length > 0);
  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label={editing ? `Edit layer set ${editing.name}` : 'New layer set'}
      className="flex flex-col gap-3 px-4 py-3"
    >
      <div className="grid grid-cols-[minmax(0,1fr)_11rem] gap-3">
        <TextField
          label="Name"
          value={input.name}
          error={errors.name ?? serverFields.name}
          maxLength={100}
          onChange={(e) => change('name', e.target.value)}
          placeholder="e.g. thermocline, fine"
        />
        <SelectField
          label="Reference pressure"
          value={String(input.referencePressure)}
          error={errors.referencePressure ?? serverFields.referencePressure}
          onChange={(e) => change('referencePressure', Number(e.target.value))}
        >
          {REFERENCE_PRESSURES.map((p) => (
            <option key={p} value={p}>
              {sigmaLabel(p)} · {p} dbar
            </option>
          ))}
        </SelectField>
      </div>
      <LevelsField
        value={input.levels}
        onChange={(v) => change('levels', v)}
        serverError={errors.levels ?? serverFields.levels}
        unit={`kg/m³ (${sigmaLabel(input.referencePressure)})`}
      />
      {showGeneral && <ErrorNotice error={mutation.error} title="The layer set was not saved" />}
      <div className="flex gap-2">
        <Button type="submit" variant="primary" busy={mutation.isPending}>
          {editing ? 'Save changes' : 'Add layer set'}
        </Button>
        {editing && (
          <Button variant="quiet" onClick={onDone}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
