import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, Navigate, useNavigate } from 'react-router-dom';
import type { z } from 'zod';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { errorMessage } from '../../../lib/api';
import { applyServerError } from '../../../lib/forms';
import { useMe } from '../../../lib/session';
import { firstAdminInputSchema, useCreateFirstAdmin, type FirstAdminInput } from '../api/createFirstAdmin';
import { useSetupStatus } from '../api/getSetupStatus';

type Output = z.output<typeof firstAdminInputSchema>;

export function SetupPage() {
  const setup = useSetupStatus();
  const me = useMe();
  const navigate = useNavigate();
  const create = useCreateFirstAdmin();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<FirstAdminInput, unknown, Output>({
    resolver: zodResolver(firstAdminInputSchema),
    defaultValues: { teamName: '', name: '', email: '', password: '' },
  });

  if (setup.isPending) {
    return (
      <Page title="Set up Holdfire" narrow>
        <Loading />
      </Page>
    );
  }
  if (setup.isError) {
    return (
      <Page title="Set up Holdfire" narrow>
        <Notice tone="danger" title="Could not check this install">
          <p>{errorMessage(setup.error)}</p>
        </Notice>
      </Page>
    );
  }
  if (!setup.data.needsFirstAdmin) {
    if (me.data) return <Navigate to="/" replace />;
    return (
      <Page title="Holdfire is set up" narrow>
        <Notice title="Already set up">
          <p>
            {setup.data.teamName ? `${setup.data.teamName} already has an administrator.` : 'This install already has an administrator.'}{' '}
            <Link to="/sign-in">Sign in</Link>, or ask an administrator for an invitation.
          </p>
        </Notice>
      </Page>
    );
  }

  const onSubmit = handleSubmit(async (input) => {
    setFormError(null);
    try {
      await create.mutateAsync(input);
      navigate('/', { replace: true });
    } catch (error) {
      setFormError(applyServerError(error, setError, ['teamName', 'name', 'email', 'password']));
    }
  });

  return (
    <Page
      title="Set up Holdfire"
      kicker="First run"
      narrow
      lead={
        <p>
          Nobody uses this install yet. Name your team and create the first administrator account. You can invite the rest of the team
          after this.
        </p>
      }
    >
      <Form onSubmit={onSubmit} aria-label="Create the first administrator">
        <FormError title="Could not set up" message={formError} />
        <TextField label="Team name" autoComplete="organization" placeholder="Tern Valley Rocketry Collective" error={errors.teamName?.message} {...register('teamName')} />
        <TextField label="Your name" autoComplete="name" error={errors.name?.message} {...register('name')} />
        <TextField
          label="E-mail"
          type="email"
          autoComplete="email"
          inputMode="email"
          autoCapitalize="none"
          spellCheck={false}
          placeholder="name@ternvalley.test"
          error={errors.email?.message}
          {...register('email')}
        />
        <TextField
          label="Password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters. A few unrelated words work well."
          revealable
          error={errors.password?.message}
          {...register('password')}
        />
        <FormActions>
          <Button type="submit" variant="primary" pending={create.isPending} pendingLabel="Creating account…">
            Create account
          </Button>
        </FormActions>
      </Form>
    </Page>
  );
}
