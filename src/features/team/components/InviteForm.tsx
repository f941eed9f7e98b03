import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/Button';
import { SelectField, TextField } from '../../../components/Field';
import { ErrorNotice, InfoNotice } from '../../../components/Notice';
import { isApiError } from '../../../lib/http';
import { ROLE_ORDER, roleLabel, type Role } from '../../auth';
import { useInviteMember } from '../api';
import { inviteFormSchema } from '../types';

/** Invite someone by e-mail: fill in, check the summary, send. */
export function InviteForm({ cruiseId, cruiseName }: { cruiseId: string; cruiseName: string }) {
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('technician');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [pending, setPending] = useState<{ email: string; role: Role } | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const invite = useInviteMember(cruiseId);

  const review = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    setSentTo(null);
    const parsed = inviteFormSchema.safeParse({ email, role });
    if (!parsed.success) {
      const out: Record<string, string> = {};
      for (const issue of parsed.error.issues) out[String(issue.path[0])] ??= issue.message;
      setErrors(out);
      return;
    }
    setErrors({});
    setPending(parsed.data);
  };

  const send = () => {
    if (!pending) return;
    invite.mutate(pending, {
      onSuccess: () => {
        setSentTo(pending.email);
        setPending(null);
        setEmail('');
      },
      onError: (error) => {
        if (isApiError(error, 400)) setErrors(error.fieldErrors());
        setPending(null);
      },
    });
  };

  if (pending) {
    return (
      <div className="flex flex-col gap-3 p-4" role="group" aria-label="Confirm invitation">
        <p className="text-sm text-ink-strong">
          Send an invitation to <span className="font-mono">{pending.email}</span> to join <strong>{cruiseName}</strong>{' '}
          as <strong>{roleLabel(pending.role)}</strong>?
        </p>
        <p className="text-xs text-ink-muted">
          They receive an e-mail with a link; it creates their account or adds the cruise to the one they have.
        </p>
        <div className="flex gap-2">
          <Button variant="primary" onClick={send} busy={invite.isPending}>
            Send invitation
          </Button>
          <Button variant="quiet" onClick={() => setPending(null)} disabled={invite.isPending}>
            Back
          </Button>
        </div>
      </div>
    );
  }

  return (
    <form onSubmit={review} noValidate aria-label="Invite a member" className="flex flex-col gap-3 p-4">
      <TextField
        label="E-mail"
        type="email"
        value={email}
        onChange={(e) => setEmail(e.target.value)}
        error={errors.email}
        autoComplete="off"
        placeholder="name@institute.example"
      />
      <SelectField label="Role" value={role} onChange={(e) => setRole(e.target.value as Role)} error={errors.role}>
        {ROLE_ORDER.map((r) => (
          <option key={r} value={r}>
            {roleLabel(r)}
          </option>
        ))}
      </SelectField>
      <div>
        <Button type="submit" variant="primary">
          Review invitation
        </Button>
      </div>
      {invite.error && !isApiError(invite.error, 400) && (
        <ErrorNotice error={invite.error} title="The invitation was not sent" />
      )}
      {sentTo && (
        <InfoNotice>
          Invitation sent to <span className="font-mono">{sentTo}</span>.
        </InfoNotice>
      )}
    </form>
  );
}
