import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { AuthFrame } from '../components/AuthFrame';
import { Button } from '../components/Button';
import { TextField } from '../components/Field';
import { ErrorNotice, Progress } from '../components/Notice';
import { roleLabel } from '../features/auth';
import { useAcceptInvitation, useInvitation } from '../features/team';
import { isApiError } from '../lib/http';
import { passwordProblem } from '../lib/password';

export default function InviteAccept() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation(token);
  const [name, setName] = useState('');
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<{ name?: string; password?: string }>({});

  if (invitation.isPending) {
    return (
      <AuthFrame title="Invitation">
        <Progress label="Reading the invitation…" />
      </AuthFrame>
    );
  }
  if (invitation.isError) {
    return (
      <AuthFrame title="Invitation" aside={<Link to="/signin">Go to sign in</Link>}>
        {isApiError(invitation.error, 404) ? (
          <p className="text-sm text-ink-strong">
            This invitation is unknown, already used or expired. Ask the cruise's chief scientist to send a new one.
          </p>
        ) : (
          <ErrorNotice error={invitation.error} title="The invitation could not be read" />
        )}
      </AuthFrame>
    );
  }

  const inv = invitation.data;
  const newAccount = !inv.accountExists;

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const problems = {
      name: newAccount && !name.trim() ? 'Enter your name as the team should see it.' : undefined,
      password: newAccount
        ? (passwordProblem(password) ?? undefined)
        : password
          ? undefined
          : 'Enter the password of your account.',
    };
    setErrors(problems);
    if (problems.name || problems.password) return;
    accept.mutate(newAccount ? { name: name.trim(), password } : { password }, {
      onSuccess: () => navigate(`/cruises/${encodeURIComponent(inv.cruise.id)}`, { replace: true }),
      onError: (error) => {
        if (isApiError(error, 400) && error.code === 'weak_password') setErrors({ password: error.message });
        if (isApiError(error, 401)) setErrors({ password: 'That is not the password of this account.' });
      },
    });
  };

  const handled =
    isApiError(accept.error, 401) || (isApiError(accept.error, 400) && accept.error.code === 'weak_password');

  return (
    <AuthFrame title={`Join ${inv.cruise.name}`}>
      <dl className="mb-5 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 border-b border-paper-rule pb-4 text-sm">
        <dt className="text-ink-muted">Cruise</dt>
        <dd className="font-semibold text-ink-strong">{inv.cruise.name}</dd>
        <dt className="text-ink-muted">Ship</dt>
        <dd>{inv.cruise.ship}</dd>
        <dt className="text-ink-muted">Your role</dt>
        <dd className="font-semibold">{roleLabel(inv.role)}</dd>
        <dt className="text-ink-muted">Invited by</dt>
        <dd>{inv.invitedBy}</dd>
        <dt className="text-ink-muted">Account</dt>
        <dd className="font-mono text-[0.8rem]">{inv.email}</dd>
      </dl>
      <form onSubmit={submit} noValidate aria-label="Accept the invitation" className="flex flex-col gap-4">
        {newAccount ? (
          <>
            <p className="text-sm text-ink-soft">Create your Sigmaline account to join the cruise.</p>
            <TextField
              label="Your name"
              autoComplete="name"
              value={name}
              onChange={(e) => setName(e.target.value)}
              error={errors.name}
              autoFocus
            />
            <TextField
              label="Choose a password"
              type="password"
              autoComplete="new-password"
              value={password}
              onChange={(e) => setPassword(e.target.value)}
              error={errors.password}
              hint="At least 10 characters, not all of one kind: mix cases, digits or symbols."
            />
          </>
        ) : (
          <>
            <p className="text-sm text-ink-soft">
              You already have an account. Confirm with its password to add this cruise to it.
            </p>
            <TextField
              label="Password"
              type="password"
              autoComplete="current-password"
              value={password}
              onChange={(e) => setPassword(e.target.value)}
              error={errors.password}
              autoFocus
            />
          </>
        )}
        {accept.error && !handled && <ErrorNotice error={accept.error} title="The invitation was not accepted" />}
        <div>
          <Button type="submit" variant="primary" busy={accept.isPending}>
            {newAccount ? 'Create account and join' : 'Join the cruise'}
          </Button>
        </div>
      </form>
    </AuthFrame>
  );
}
