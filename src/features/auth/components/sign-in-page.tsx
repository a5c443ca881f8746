import { useId, useRef, useState, type FormEvent } from 'react';
import { Link, useLocation, useNavigate } from 'react-router-dom';
import { ApiError } from '../../../lib/api-client.ts';
import { useMe } from '../api/get-me.ts';
import { useSignIn } from '../api/sign-in.ts';

/** Where the route guard asks to come back to after signing in. */
export interface SignInLocationState {
  from?: { pathname: string; search?: string; hash?: string };
}

/** Only a path inside this app: never another origin, never back to the sign-in page itself. */
function returnPath(state: unknown): string {
  const from = (state as SignInLocationState | null)?.from;
  if (!from || typeof from.pathname !== 'string') return '/jobs';
  if (!from.pathname.startsWith('/') || from.pathname.startsWith('//') || from.pathname === '/sign-in') return '/jobs';
  return `${from.pathname}${from.search ?? ''}${from.hash ?? ''}`;
}

interface FormErrors {
  /** What went wrong, in the server's words, for the alert beside the form. */
  summary: string;
  email?: string;
  password?: string;
}

function errorsFrom(error: unknown): FormErrors {
  if (error instanceof ApiError) {
    if (error.issues.length > 0) {
      const byField: FormErrors = { summary: error.issues.map((i) => i.message).join(' ') };
      for (const issue of error.issues) {
        if (issue.path === 'email' || issue.path === 'password') byField[issue.path] ??= issue.message;
      }
      return byField;
    }
    return { summary: error.message };
  }
  if (error instanceof Error) return { summary: error.message };
  return { summary: 'Signing in failed. Try again.' };
}

export function SignInPage() {
  const location = useLocation();
  const navigate = useNavigate();
  const me = useMe();
  const signIn = useSignIn();
  const [errors, setErrors] = useState<FormErrors | null>(null);
  const emailRef = useRef<HTMLInputElement>(null);
  const passwordRef = useRef<HTMLInputElement>(null);
  const ids = { email: useId(), password: useId(), emailError: useId(), passwordError: useId(), caution: useId() };
  const destination = returnPath(location.state);

  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (signIn.isPending) return;
    const data = new FormData(event.currentTarget);
    const email = String(data.get('email') ?? '');
    const password = String(data.get('password') ?? '');
    setErrors(null);
    signIn.mutate(
      { email, password },
      {
        onSuccess: () => navigate(destination, { replace: true }),
        onError: (error) => {
          const found = errorsFrom(error);
          setErrors(found);
          // Put the cursor where the fix is typed: the field named, else the password to retype.
          if (found.email) emailRef.current?.focus();
          else passwordRef.current?.select();
        },
      },
    );
  }

  const signedInAs = me.data;

  return (
    <div className="flex min-h-dvh items-center justify-center p-6">
      <div className="w-full max-w-3xl">
        <header className="mb-6">
          <h1 className="text-xl font-semibold tracking-tight">Boardwalk</h1>
          <p className="text-muted">Schedules of test results, typed and checked board by board.</p>
        </header>

        {signedInAs && (
          <p className="mb-4 rounded border border-line bg-surface px-3 py-2">
            You are signed in as {signedInAs.name}.{' '}
            <Link className="font-medium text-accent underline underline-offset-2" to={destination}>
              Carry on
            </Link>{' '}
            or sign in as someone else below.
          </p>
        )}

        <div className="grid items-start gap-6 md:grid-cols-[22rem_1fr]">
          <form
            className="space-y-4 rounded border border-line bg-surface p-5"
            aria-labelledby="sign-in-heading"
            aria-describedby={ids.caution}
            noValidate
            onSubmit={handleSubmit}
          >
            <h2 id="sign-in-heading" className="text-base font-semibold">
              Sign in
            </h2>
            <div className="space-y-1">
              <label htmlFor={ids.email} className="block font-medium">
                E-mail
              </label>
              <input
                ref={emailRef}
                id={ids.email}
                name="email"
                type="email"
                autoComplete="username"
                spellCheck={false}
                autoFocus
                required
                aria-invalid={errors?.email ? true : undefined}
                aria-describedby={errors?.email ? ids.emailError : undefined}
                className="block w-full rounded border border-line-strong bg-surface px-2 py-1.5 aria-invalid:border-danger"
              />
              {errors?.email && (
                <p id={ids.emailError} className="text-danger">
                  {errors.email}
                </p>
              )}
            </div>
            <div className="space-y-1">
              <label htmlFor={ids.password} className="block font-medium">
                Password
              </label>
              <input
                ref={passwordRef}
                id={ids.password}
                name="password"
                type="password"
                autoComplete="current-password"
                required
                aria-invalid={errors?.password ? true : undefined}
                aria-describedby={errors?.password ? ids.passwordError : undefined}
                className="block w-full rounded border border-line-strong bg-surface px-2 py-1.5 aria-invalid:border-danger"
              />
              {errors?.password && (
                <p id={ids.passwordError} className="text-danger">
                  {errors.password}
                </p>
              )}
            </div>
            <button
              type="submit"
              aria-disabled={signIn.isPending || undefined}
              className="w-full rounded bg-accent px-3 py-1.5 font-medium text-white hover:bg-accent-hover aria-disabled:opacity-70"
            >
              {signIn.isPending ? 'Signing in…' : 'Sign in'}
            </button>
          </form>

          {/* Always in the page, so assistive technology announces a message the moment it appears. */}
          <div role="alert" className="empty:hidden rounded border border-danger bg-danger-soft px-3 py-2 text-danger">
            {errors?.summary}
          </div>
        </div>

        <p id={ids.caution} className="mt-6 max-w-2xl text-xs text-muted">
          Testing is for competent people after safe isolation; Boardwalk records and checks results, it does not
          replace the inspector's judgement. Local regulations and the current edition of the standard take
          precedence.
        </p>
      </div>
    </div>
  );
}
