import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import type { z } from 'zod';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Page } from '../../../components/ui/Page';
import { applyServerError } from '../../../lib/forms';
import { passwordResetRequestSchema, useRequestPasswordReset, type PasswordResetRequestInput } from '../api/requestPasswordReset';

type Output = z.output<typeof passwordResetRequestSchema>;

export function RequestPasswordResetPage() {
  const request = useRequestPasswordReset();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<PasswordResetRequestInput, unknown, Output>({
    resolver: zodResolver(passwordResetRequestSchema),
    defaultValues: { email: '' },
  });

  const onSubmit = handleSubmit(async (input) => {
    setFormError(null);
    try {
      await request.mutateAsync(input);
      setSentTo(input.email);
    } catch (error) {
      setFormError(applyServerError(error, setError, ['email']));
    }
  });

  return (
    <Page title="Reset your password" narrow lead={<p>Enter the e-mail address you sign in with. We will send a link to choose a new password.</p>}>
      {sentTo ? (
        // Same words whether or not the address has an account: the page must not reveal who is a member.
        <Notice tone="success" title="Check your e-mail">
          <p>
            If an account uses {sentTo}, a reset link is on its way. The link works once and for a limited time. If nothing arrives in a few
            minutes, check the address or ask your administrator.
          </p>
        </Notice>
      ) : (
        <Form onSubmit={onSubmit} aria-label="Ask for a reset link">
          <FormError title="Could not send the link" message={formError} />
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
          <FormActions>
            <Button type="submit" variant="primary" pending={request.isPending} pendingLabel="Sending…">
              Send reset link
            </Button>
          </FormActions>
        </Form>
      )}
      <p className="mt-8">
        <Link to="/sign-in">Back to sign in</Link>
      </p>
    </Page>
  );
}
