import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { applyServerError } from '../../../lib/forms';
import { passwordChangeSchema, useChangePassword, type PasswordChangeInput } from '../api/changePassword';

export function ChangePasswordForm() {
  const change = useChangePassword();
  const [formError, setFormError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<PasswordChangeInput>({
    resolver: zodResolver(passwordChangeSchema),
    defaultValues: { currentPassword: '', newPassword: '' },
  });

  const onSubmit = handleSubmit(async (input) => {
    setFormError(null);
    setDone(false);
    try {
      await change.mutateAsync(input);
      reset();
      setDone(true);
    } catch (error) {
      setFormError(applyServerError(error, setError, ['currentPassword', 'newPassword'], { bad_password: 'currentPassword' }));
    }
  });

  return (
    <Form onSubmit={onSubmit} aria-label="Change password">
      {done ? (
        <Notice tone="success" title="Password changed">
          <p>Use the new password next time you sign in.</p>
        </Notice>
      ) : null}
      <FormError title="Could not change the password" message={formError} />
      <TextField
        label="Current password"
        type="password"
        autoComplete="current-password"
        revealable
        error={errors.currentPassword?.message}
        {...register('currentPassword')}
      />
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. A few unrelated words work well."
        revealable
        error={errors.newPassword?.message}
        {...register('newPassword')}
      />
      <FormActions>
        <Button type="submit" variant="primary" pending={change.isPending} pendingLabel="Changing…">
          Change password
        </Button>
      </FormActions>
    </Form>
  );
}
