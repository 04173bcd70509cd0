import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { applyServerError } from '../../../lib/forms';
import { profileUpdateSchema, useUpdateProfile, type ProfileUpdateInput } from '../api/updateProfile';

type Output = z.output<typeof profileUpdateSchema>;

export function ChangeNameForm({ currentName }: { currentName: string }) {
  const update = useUpdateProfile();
  const [formError, setFormError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<ProfileUpdateInput, unknown, Output>({
    resolver: zodResolver(profileUpdateSchema),
    defaultValues: { name: currentName },
  });

  const onSubmit = handleSubmit(async (input) => {
    setFormError(null);
    setDone(false);
    try {
      const me = await update.mutateAsync(input);
      reset({ name: me.name });
      setDone(true);
    } catch (error) {
      setFormError(applyServerError(error, setError, ['name']));
    }
  });

  return (
    <Form onSubmit={onSubmit} aria-label="Change name">
      {done ? (
        <Notice tone="success" title="Name saved">
          <p>New entries in logs use the new name.</p>
        </Notice>
      ) : null}
      <FormError title="Could not save the name" message={formError} />
      <TextField label="Name" autoComplete="name" error={errors.name?.message} {...register('name')} />
      <FormActions>
        <Button type="submit" variant="primary" pending={update.isPending} pendingLabel="Saving…">
          Save name
        </Button>
      </FormActions>
    </Form>
  );
}
