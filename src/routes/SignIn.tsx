import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthFrame } from '../components/AuthFrame';
import { Button } from '../components/Button';
import { TextField } from '../components/Field';
import { ErrorNotice } from '../components/Notice';
import { safeReturnPath, useSignIn } from '../features/auth';
import { isApiError } from '../lib/http';

function signInProblem(error: unknown): string | null {
  if (!error) return null;
  if (isApiError(error, 401)) return 'That e-mail and password do not match an account.';
  if (isApiError(error, 429)) return 'Too many attempts. Wait a minute, then try again.';
  return null;
}

export default function SignIn() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [missing, setMissing] = useState<{ email?: string; password?: string }>({});
  const next = safeReturnPath(params.get('next'));

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const problems = {
      email: email.trim() ? undefined : 'Enter your e-mail address.',
      password: password ? undefined : 'Enter your password.',
    };
    setMissing(problems);
    if (problems.email || problems.password) return;
    signIn.mutate({ email: email.trim(), password }, { onSuccess: () => navigate(next, { replace: true }) });
  };

  const known = signInProblem(signIn.error);

  return (
    <AuthFrame
      title="Sign in"
      aside={
        <p>
          Sigmaline is where a cruise's science party turns CTD casts into checked sections. Accounts come by invitation
          from a cruise's chief scientist.
        </p>
      }
    >
      <form onSubmit={submit} noValidate aria-label="Sign in" className="flex flex-col gap-4">
        <TextField
          label="E-mail"
          type="email"
          autoComplete="username"
          value={email}
          onChange={(e) => setEmail(e.target.value)}
          error={missing.email}
          autoFocus
        />
        <TextField
          label="Password"
          type="password"
          autoComplete="current-password"
          value={password}
          onChange={(e) => setPassword(e.target.value)}
          error={missing.password}
        />
        {known ? (
          <div role="alert" className="border-l-2 border-warn bg-warn-wash/60 px-3 py-2 text-sm text-ink-strong">
            {known}
          </div>
        ) : (
          signIn.error && <ErrorNotice error={signIn.error} title="Could not sign in" />
        )}
        <div className="flex items-center justify-between">
          <Button type="submit" variant="primary" busy={signIn.isPending}>
            Sign in
          </Button>
          <Link to={email ? `/reset?email=${encodeURIComponent(email.trim())}` : '/reset'} className="text-sm">
            Forgot your password?
          </Link>
        </div>
      </form>
    </AuthFrame>
  );
}
