import type { ComponentPropsWithRef, ReactNode } from 'react';
import { Notice } from './Notice';

/**
 * A form with browser validation bubbles turned off: the zod schemas give the same messages in the
 * same place (under the field) on every device.
 */
export function Form({ className = '', children, ...rest }: ComponentPropsWithRef<'form'>) {
  return (
    <form noValidate className={`flex flex-col gap-5 ${className}`} {...rest}>
      {children}
    </form>
  );
}

/** The general error of a form (anything not tied to one field), announced as an alert. */
export function FormError({ title, message }: { title: string; message: string | null | undefined }) {
  if (!message) return null;
  return (
    <Notice tone="danger" title={title}>
      <p>{message}</p>
    </Notice>
  );
}

export function FormActions({ children }: { children: ReactNode }) {
  return <div className="flex flex-wrap items-center gap-3 pt-1">{children}</div>;
}
