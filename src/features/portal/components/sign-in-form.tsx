import { useRef, useState } from 'react';
import { PortalSignInRequest } from '@shared/schemas/portal';
import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { useZodForm } from '@/lib/form';
import { useRequestSignInLink } from '../api/request-sign-in-link';

/** Minutes a sign-in link works; the server's rule, said to the customer. */
const LINK_MINUTES = 15;

/**
 * The customer's e-mail, and the page they were headed for (`next`, from the address) so the
 * link lands them there. The answer is the same whether or not the address is known.
 */
export function SignInForm({ next }: { next?: string }) {
  const request = useRequestSignInLink();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const headingRef = useRef<HTMLHeadingElement>(null);
  const form = useZodForm(
    PortalSignInRequest,
    { email: '', next: next ?? '' },
    { toInput: (v) => ({ input: { email: v.email, ...(v.next ? { next: v.next } : {}) } }) },
  );

  const submit = form.handleSubmit((data) => {
    request.mutate(data, {
      onSuccess: () => {
        setSentTo(data.email);
        requestAnimationFrame(() => headingRef.current?.focus());
      },
      onError: form.showError,
    });
  });

  if (sentTo) {
    return (
      <div role="status" className="space-y-3">
        <h2 ref={headingRef} tabIndex={-1} className="text-xl font-semibold text-canvas-900 focus:outline-none">
          Check your e-mail
        </h2>
        <p className="text-canvas-800">
          A sign-in link is on its way to <strong className="break-all">{sentTo}</strong>. It works once, for {LINK_MINUTES} minutes. If you rent from more than
          one company, each sends its own link, and each opens that company's rentals.
        </p>
        <p className="text-sm text-canvas-700">
          Nothing after a few minutes? Look in your spam or junk folder. If the rental company has a different address for you, try that one: links only go to
          addresses they have on file.
        </p>
        <div className="flex flex-col gap-2 pt-2 sm:flex-row">
          <Button
            variant="secondary"
            className="w-full sm:w-auto"
            onClick={() => {
              request.reset();
              setSentTo(null);
            }}
          >
            Use another address or send again
          </Button>
        </div>
      </div>
    );
  }

  return (
    <form ref={form.formRef} noValidate onSubmit={submit} aria-label="Sign in" className="space-y-4">
      <FormMessage message={form.formError} />
      <TextField
        label="E-mail"
        type="email"
        autoComplete="email"
        inputMode="email"
        autoCapitalize="none"
        spellCheck={false}
        hint="The address your rental company has for you."
        {...form.field('email')}
      />
      <input type="hidden" name="next" value={form.values.next} />
      <Button type="submit" isLoading={request.isPending} className="w-full">
        E-mail me a sign-in link
      </Button>
    </form>
  );
}
