import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { z } from 'zod';
import { newPasswordSchema, tokenSchema } from '../../../contract/people';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Page } from '../../../components/ui/Page';
import { isApiError } from '../../../lib/api';
import { applyServerError } from '../../../lib/forms';
import { useCompletePasswordReset } from '../api/completePasswordReset';

const formSchema = z.object({ password: newPasswordSchema });
type FormInput = z.input<typeof formSchema>;

export function CompletePasswordResetPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const complete = useCompletePasswordReset();
  const [formError, setFormError] = useState<string | null>(null);
  const [linkDead, setLinkDead] = useState(!tokenSchema.safeParse(token).success);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<FormInput>({ resolver: zodResolver(formSchema), defaultValues: { password: '' } });

  const onSubmit = handleSubmit(async ({ password }) => {
    setFormError(null);
    try {
      await complete.mutateAsync({ token, password });
      navigate('/sign-in', { replace: true, state: { notice: 'Your password is changed. Sign in with the new one.' } });
    } catch (error) {
      if (isApiError(error) && (error.status === 410 || error.status === 404 || error.details.some((d) => d.path === 'token'))) {
        setLinkDead(true);
        return;
      }
      setFormError(applyServerError(error, setError, ['password']));
    }
  });

  if (linkDead) {
    return (
      <Page title="Choose a new password" narrow>
        <Notice tone="danger" title="This reset link no longer works">
          <p>It has expired, was already used, or was not copied whole. Reset links work once and for a limited time.</p>
        </Notice>
        <p className="mt-6">
          <Link to="/reset-password">Ask for a new link</Link>
        </p>
      </Page>
    );
  }

  return (
    <Page title="Choose a new password" narrow>
      <Form onSubmit={onSubmit} aria-label="Choose a new password">
        <FormError title="Could not change the password" message={formError} />
        <TextField
          label="New password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters. A few unrelated words work well."
          revealable
          error={errors.password?.message}
          {...register('password')}
        />
        <FormActions>
          <Button type="submit" variant="primary" pending={complete.isPending} pendingLabel="Saving…">
            Set new password
          </Button>
        </FormActions>
      </Form>
      <p className="mt-8">
        <Link to="/sign-in">Back to sign in</Link>
      </p>
    </Page>
  );
}
