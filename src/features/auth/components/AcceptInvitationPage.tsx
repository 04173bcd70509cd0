import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { z } from 'zod';
import { personNameSchema, newPasswordSchema, tokenSchema } from '../../../contract/people';
import { ROLE_LABELS } from '../../../domain/people/roles';
import { Badge } from '../../../components/ui/Badge';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Form, FormActions, FormError } from '../../../components/ui/Form';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { Time } from '../../../components/ui/Time';
import { errorMessage, isApiError } from '../../../lib/api';
import { applyServerError } from '../../../lib/forms';
import { useMe } from '../../../lib/session';
import { useAcceptInvitation } from '../api/acceptInvitation';
import { useInvitationPreview } from '../api/getInvitationPreview';

// The token comes from the URL, so the form only asks for name and password.
const formSchema = z.object({ name: personNameSchema, password: newPasswordSchema });
type FormInput = z.input<typeof formSchema>;
type FormOutput = z.output<typeof formSchema>;

const linkProblems: Record<string, { title: string; text: string }> = {
  not_found: { title: 'This invitation link is not valid', text: 'Check that the whole link was copied, or ask your administrator to send a new invitation.' },
  expired: { title: 'This invitation has expired', text: 'Ask your administrator to send you a new invitation.' },
  used: { title: 'This invitation was already used', text: 'If you set up your account already, sign in.' },
};

export function AcceptInvitationPage() {
  const { token = '' } = useParams();
  const tokenOk = tokenSchema.safeParse(token).success;
  return tokenOk ? <AcceptInvitation token={token} /> : <LinkProblem code="not_found" />;
}

function LinkProblem({ code, message }: { code: string; message?: string }) {
  const problem = linkProblems[code] ?? { title: 'Could not open this invitation', text: message ?? 'Try the link again in a moment.' };
  return (
    <Page title="Invitation" narrow>
      <Notice tone="danger" title={problem.title}>
        <p>{problem.text}</p>
      </Notice>
      <p className="mt-6">
        <Link to="/sign-in">Go to sign in</Link>
      </p>
    </Page>
  );
}

function AcceptInvitation({ token }: { token: string }) {
  const preview = useInvitationPreview(token);
  const me = useMe();
  const accept = useAcceptInvitation();
  const navigate = useNavigate();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(formSchema),
    defaultValues: { name: '', password: '' },
  });

  if (preview.isPending) {
    return (
      <Page title="Invitation" narrow>
        <Loading label="Checking the invitation…" />
      </Page>
    );
  }
  if (preview.isError) {
    const code = isApiError(preview.error) ? preview.error.code : 'unknown';
    return <LinkProblem code={code} message={errorMessage(preview.error)} />;
  }
  const invitation = preview.data;

  const onSubmit = handleSubmit(async (input) => {
    setFormError(null);
    try {
      await accept.mutateAsync({ token, ...input });
      navigate('/', { replace: true });
    } catch (error) {
      setFormError(applyServerError(error, setError, ['name', 'password']));
    }
  });

  return (
    <Page title="Join your team on Holdfire" kicker="Invitation" narrow>
      <dl className="mb-6 grid gap-x-4 gap-y-2 rounded-md border-2 border-line bg-surface p-4 sm:grid-cols-[auto_1fr]">
        <dt className="font-bold">E-mail</dt>
        <dd className="break-all">{invitation.email}</dd>
        <dt className="font-bold">Roles</dt>
        <dd className="flex flex-wrap gap-2">
          {invitation.roles.map((role) => (
            <Badge key={role} glyph="person">{ROLE_LABELS[role]}</Badge>
          ))}
        </dd>
        <dt className="font-bold">Link works until</dt>
        <dd>
          <Time value={invitation.expiresAt} relative />
        </dd>
      </dl>
      {me.data ? (
        <Notice tone="warning" className="mb-5">
          <p>
            You are signed in as {me.data.name} ({me.data.email}). Creating this account signs you in as {invitation.email} instead.
          </p>
        </Notice>
      ) : null}
      <Form onSubmit={onSubmit} aria-label="Create your account">
        <FormError title="Could not create the account" message={formError} />
        <TextField label="Your name" autoComplete="name" hint="As the team knows you; it appears in count logs." error={errors.name?.message} {...register('name')} />
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
          <Button type="submit" variant="primary" pending={accept.isPending} pendingLabel="Creating account…">
            Create account
          </Button>
        </FormActions>
      </Form>
    </Page>
  );
}
