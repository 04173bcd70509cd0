import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, Navigate, useLocation, useNavigate, useSearchParams } from 'react-router-dom';
import type { z } from 'zod';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Page } from '../../../components/ui/Page';
import { applyServerError } from '../../../lib/forms';
import { useMe } from '../../../lib/session';
import { useSetupStatus } from '../api/getSetupStatus';
import { loginInputSchema, useSignIn, type SignInInput } from '../api/signIn';
import { safeNextPath } from './nextPath';

type Output = z.output<typeof loginInputSchema>;

export function SignInPage() {
  const [params] = useSearchParams();
  const next = safeNextPath(params.get('next'));
  const location = useLocation();
  const notice = (location.state as { notice?: string } | null)?.notice;
  const navigate = useNavigate();
  const me = useMe();
  const setup = useSetupStatus();
  const signIn = useSignIn();
  const [formError, setFormError] = useState<string | null>(null);

  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<SignInInput, unknown, Output>({
    resolver: zodResolver(loginInputSchema),
    defaultValues: { email: '', password: '' },
  });

  if (me.data) return <Navigate to={next} replace />;
  // A fresh install has nobody to sign in as yet.
  if (setup.data?.needsFirstAdmin) return <Navigate to="/setup" replace />;

  const onSubmit = handleSubmit(async (input) => {
    setFormError(null);
    try {
      await signIn.mutateAsync(input);
      navigate(next, { replace: true });
    } catch (error) {
      setFormError(applyServerError(error, setError, ['email', 'password']));
    }
  });

  return (
    <Page title="Sign in" narrow lead={setup.data?.teamName ? <p>Sign in to {setup.data.teamName} on Holdfire.</p> : undefined}>
      {notice ? (
        <Notice tone="success" className="mb-5">
          <p>{notice}</p>
        </Notice>
      ) : null}
      {next !== '/' ? (
        <Notice className="mb-5" title="Sign in to continue">
          <p>You will go back to the page you asked for.</p>
        </Notice>
      ) : null}
      <Form onSubmit={onSubmit} aria-label="Sign in">
        <FormError title="Could not sign in" message={formError} />
        <TextField
          label="E-mail"
          type="email"
          autoComplete="username"
          inputMode="email"
          autoCapitalize="none"
          spellCheck={false}
          placeholder="name@ternvalley.test"
          error={errors.email?.message}
          {...register('email')}
        />
        <TextField label="Password" type="password" autoComplete="current-password" revealable error={errors.password?.message} {...register('password')} />
        <FormActions>
          <Button type="submit" variant="primary" pending={signIn.isPending} pendingLabel="Signing in…">
            Sign in
          </Button>
          <Link to="/reset-password" className="inline-flex min-h-12 items-center px-1 font-bold">
            Forgot your password?
          </Link>
        </FormActions>
      </Form>
      <p className="mt-8 text-ink-muted">New to the team? Ask your Holdfire administrator for an invitation.</p>
    </Page>
  );
}
