import { useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { AuthFrame } from '../components/AuthFrame';
import { Button } from '../components/Button';
import { TextField } from '../components/Field';
import { ErrorNotice, InfoNotice } from '../components/Notice';
import { useRequestPasswordReset } from '../features/auth';

export default function ResetRequest() {
  const [params] = useSearchParams();
  const [email, setEmail] = useState(params.get('email') ?? '');
  const [missing, setMissing] = useState<string | undefined>();
  const request = useRequestPasswordReset();

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const value = email.trim();
    if (!/^[^\s@]+@[^\s@]+$/.test(value)) {
      setMissing('Enter the e-mail address of your account.');
      return;
    }
    setMissing(undefined);
    request.mutate(value);
  };

  return (
    <AuthFrame title="Reset your password" aside={<Link to="/signin">Back to sign in</Link>}>
      {request.isSuccess ? (
        <InfoNotice>
          If an account uses <span className="font-mono">{email.trim()}</span>, a message with a link to choose a new
          password is on its way. The link works once and expires.
        </InfoNotice>
      ) : (
        <form onSubmit={submit} noValidate aria-label="Request a password reset" className="flex flex-col gap-4">
          <p className="text-sm text-ink-soft">
            We send a link to choose a new password to the address of your account.
          </p>
          <TextField
            label="E-mail"
            type="email"
            autoComplete="username"
            value={email}
            onChange={(e) => setEmail(e.target.value)}
            error={missing}
            autoFocus
          />
          {request.error && <ErrorNotice error={request.error} title="The request was not sent" />}
          <div>
            <Button type="submit" variant="primary" busy={request.isPending}>
              Send reset link
            </Button>
          </div>
        </form>
      )}
    </AuthFrame>
  );
}
