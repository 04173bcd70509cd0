import type { ComponentPropsWithRef } from 'react';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet';

const base =
  'inline-flex min-h-12 items-center justify-center gap-2 rounded-md border-2 px-4 py-2 text-base font-bold leading-tight no-underline ' +
  'cursor-pointer select-none disabled:cursor-not-allowed disabled:opacity-70';

const variants: Record<ButtonVariant, string> = {
  primary: 'border-[3px] border-accent-line bg-accent text-accent-ink hover:bg-accent-hover',
  secondary: 'border-line bg-surface text-ink hover:bg-selected',
  danger: 'border-danger bg-danger-wash text-danger hover:bg-surface',
  quiet: 'border-transparent bg-transparent text-ink underline decoration-2 underline-offset-4 hover:border-line-soft',
};

/** Classes for anything that should look like a button (links to an action, summary elements). */
export function buttonClasses(variant: ButtonVariant = 'secondary', extra = ''): string {
  return `${base} ${variants[variant]} ${extra}`;
}

export interface ButtonProps extends ComponentPropsWithRef<'button'> {
  variant?: ButtonVariant;
  /** While true the button is disabled and shows pendingLabel, so a second tap cannot send twice. */
  pending?: boolean;
  pendingLabel?: string;
}

export function Button({ variant = 'secondary', pending = false, pendingLabel, className = '', children, disabled, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClasses(variant, className)}
      disabled={disabled || pending}
      aria-busy={pending || undefined}
      {...rest}
    >
      {pending ? (
        <>
          <span aria-hidden="true" className="inline-block size-4 animate-spin rounded-full border-2 border-current border-t-transparent motion-reduce:animate-none" />
          <span>{pendingLabel ?? 'Working…'}</span>
        </>
      ) : (
        children
      )}
    </button>
  );
}
