import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { TextAreaField, TextField } from '../../../components/Field';
import { ErrorNotice } from '../../../components/Notice';
import { isApiError } from '../../../lib/http';
import { useCreateCruise } from '../api';
import { fieldErrorsOf, newCruiseSchema, type Cruise, type NewCruiseInput } from '../types';

const EMPTY: Required<{ [K in keyof NewCruiseInput]-?: string }> = {
  name: '',
  ship: '',
  startDate: '',
  endDate: '',
  portStart: '',
  portEnd: '',
  region: '',
  description: '',
};

type Values = typeof EMPTY;

/** Create a cruise. Validates before sending; the server's field errors land on the same fields. */
export function CreateCruiseForm({
  onCreated,
  onCancel,
}: {
  onCreated?: (cruise: Cruise) => void;
  onCancel?: () => void;
}) {
  const [values, setValues] = useState<Values>(EMPTY);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const create = useCreateCruise();

  const set = (field: keyof Values) => (e: { target: { value: string } }) => {
    const value = e.target.value;
    setValues((v) => ({ ...v, [field]: value }));
    if (errors[field]) setErrors(({ [field]: _gone, ...rest }) => rest);
  };

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const parsed = newCruiseSchema.safeParse(values);
    if (!parsed.success) {
      setErrors(fieldErrorsOf(parsed.error));
      return;
    }
    setErrors({});
    create.mutate(parsed.data, {
      onSuccess: (cruise) => {
        setValues(EMPTY);
        onCreated?.(cruise);
      },
      onError: (error) => {
        if (isApiError(error, 400)) setErrors(error.fieldErrors());
      },
    });
  };

  const serverProblem = create.error && !(isApiError(create.error, 400) && Object.keys(errors).length > 0);

  return (
    <form onSubmit={submit} noValidate aria-label="New cruise" className="flex flex-col gap-4 p-4">
      <div className="grid grid-cols-1 gap-x-4 gap-y-3 md:grid-cols-2">
        <TextField
          label="Cruise name"
          name="name"
          value={values.name}
          onChange={set('name')}
          error={errors.name}
          placeholder="e.g. Meridian Drift 2026"
          autoComplete="off"
        />
        <TextField
          label="Ship"
          name="ship"
          value={values.ship}
          onChange={set('ship')}
          error={errors.ship}
          placeholder="e.g. RV Halcyon Tern"
          autoComplete="off"
        />
        <TextField
          label="Departure date"
          name="startDate"
          type="date"
          mono
          value={values.startDate}
          onChange={set('startDate')}
          error={errors.startDate}
        />
        <TextField
          label="Return date"
          name="endDate"
          type="date"
          mono
          value={values.endDate}
          onChange={set('endDate')}
          error={errors.endDate}
        />
        <TextField
          label="Port of departure"
          name="portStart"
          optional
          value={values.portStart}
          onChange={set('portStart')}
          error={errors.portStart}
          autoComplete="off"
        />
        <TextField
          label="Port of return"
          name="portEnd"
          optional
          value={values.portEnd}
          onChange={set('portEnd')}
          error={errors.portEnd}
          autoComplete="off"
        />
        <TextField
          label="Region"
          name="region"
          optional
          value={values.region}
          onChange={set('region')}
          error={errors.region}
          fieldClassName="md:col-span-2"
          placeholder="e.g. Subtropical front, western basin"
          autoComplete="off"
        />
        <TextAreaField
          label="Description"
          name="description"
          optional
          value={values.description}
          onChange={set('description')}
          error={errors.description}
          fieldClassName="md:col-span-2"
          rows={3}
        />
      </div>
      {serverProblem && <ErrorNotice error={create.error} title="The cruise was not created" />}
      <div className="flex items-center gap-2">
        <Button type="submit" variant="primary" busy={create.isPending}>
          Create cruise
        </Button>
        {onCancel && (
          <Button variant="quiet" onClick={onCancel}>
            Cancel
          </Button>
        )}
        <p className="ml-auto text-xs text-ink-muted">You become the cruise's chief scientist.</p>
      </div>
    </form>
  );
}
