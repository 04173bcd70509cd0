import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { applyServerError } from '../../../lib/forms';
import { ROLE_OPTIONS } from '../../../lib/roles';
import { inviteInputSchema, useCreateInvitation, type InviteInput } from '../api/createInvitation';

type Output = z.output<typeof inviteInputSchema>;

export function InviteForm() {
  const create = useCreateInvitation();
  const [formError, setFormError] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const {
    register,
    control,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<InviteInput, unknown, Output>({
    resolver: zodResolver(inviteInputSchema),
    defaultValues: { email: '', roles: [] },
  });

  const onSubmit = handleSubmit(async (input) => {
    setFormError(null);
    setSentTo(null);
    try {
      const invitation = await create.mutateAsync(input);
      setSentTo(invitation.email);
      reset();
    } catch (error) {
      // already_exists: the address belongs to a member; say so at the e-mail field.
      setFormError(applyServerError(error, setError, ['email', 'roles'], { already_exists: 'email' }));
    }
  });

  return (
    <Form onSubmit={onSubmit} aria-label="Invite someone">
      {sentTo ? (
        <Notice tone="success" title="Invitation sent">
          <p>{sentTo} has an e-mail with a link to join. It appears under pending invitations until they accept.</p>
        </Notice>
      ) : null}
      <FormError title="Could not send the invitation" message={formError} />
      <TextField
        label="E-mail"
        type="email"
        autoComplete="off"
        inputMode="email"
        autoCapitalize="none"
        spellCheck={false}
        placeholder="name@ternvalley.test"
        error={errors.email?.message}
        {...register('email')}
      />
      <Controller
        control={control}
        name="roles"
        render={({ field, fieldState }) => (
          <CheckboxGroup legend="Roles" options={ROLE_OPTIONS} value={field.value} onChange={field.onChange} error={fieldState.error?.message} />
        )}
      />
      <FormActions>
        <Button type="submit" variant="primary" pending={create.isPending} pendingLabel="Sending…">
          Send invitation
        </Button>
      </FormActions>
    </Form>
  );
}
