import { useState, type FormEvent } from 'react';
import { Link, useParams } from 'react-router-dom';
import { AuthFrame } from '../components/AuthFrame';
import { Button } from '../components/Button';
import { TextField } from '../components/Field';
import { ErrorNotice, InfoNotice } from '../components/Notice';
import { useConfirmPasswordReset } from '../features/auth';
import { isApiError } from '../lib/http';
import { passwordProblem } from '../lib/password';

export default function ResetConfirm() {
  const { token = '' } = useParams();
  const confirm = useConfirmPasswordReset();
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const [errors, setErrors] = useState<{ password?: string; repeat?: string }>({});

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const problems = {
      password: passwordProblem(password) ?? undefined,
      repeat: repeat === password ? undefined : 'The two passwords differ.',
    };
    setErrors(problems);
    if (problems.password || problems.repeat) return;
    confirm.mutate(
      { token, password },
      {
        onError: (error) => {
          if (isApiError(error, 400) && error.code === 'weak_password') setErrors({ password: error.message });
        },
      },
    );
  };

  if (confirm.isSuccess) {
    return (
      <AuthFrame title="Password changed">
        <InfoNotice>Your new password is set.</InfoNotice>
        <p className="mt-4">
          <Link to="/signin">Sign in</Link>
        </p>
      </AuthFrame>
    );
  }

  const invalidToken = isApiError(confirm.error, 400) && confirm.error.code === 'invalid_token';

  return (
    <AuthFrame title="Choose a new password" aside={<Link to="/signin">Back to sign in</Link>}>
      {invalidToken ? (
        <div className="flex flex-col gap-3">
          <ErrorNotice error={confirm.error} title="This link no longer works" />
          <p className="text-sm text-ink-soft">
            Reset links work once and expire. <Link to="/reset">Ask for a new one.</Link>
          </p>
        </div>
      ) : (
        <form onSubmit={submit} noValidate aria-label="Choose a new password" className="flex flex-col gap-4">
          <TextField
            label="New password"
            type="password"
            autoComplete="new-password"
            value={password}
            onChange={(e) => setPassword(e.target.value)}
            error={errors.password}
            hint="At least 10 characters, not all of one kind: mix cases, digits or symbols."
            autoFocus
          />
          <TextField
            label="Repeat the new password"
            type="password"
            autoComplete="new-password"
            value={repeat}
            onChange={(e) => setRepeat(e.target.value)}
            error={errors.repeat}
          />
          {confirm.error && !(isApiError(confirm.error, 400) && confirm.error.code === 'weak_password') && (
            <ErrorNotice error={confirm.error} title="The password was not changed" />
          )}
          <div>
            <Button type="submit" variant="primary" busy={confirm.isPending}>
              Set password
            </Button>
          </div>
        </form>
      )}
    </AuthFrame>
  );
}
