import { useEffect, useState } from 'react';
import { codeBody, passwordBody } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import type { ApiError } from '@/lib/api-client';
import { showServerError, useZodForm } from '@/lib/form';
import {
  useConfirmTotp,
  useDisableTotp,
  useNewRecoveryCodes,
  useStartTotpSetup,
  type AccountInfo,
} from '../api/account';

/** The otpauth:// address as an SVG QR code in a data: URL (allowed by the page's img-src). */
function useQrImage(text: string | undefined) {
  const [src, setSrc] = useState<string>();
  useEffect(() => {
    if (!text) return setSrc(undefined);
    let live = true;
    void import('qrcode').then(async (m) => {
      const qr = ('default' in m ? m.default : m) as typeof m;
      const svg = await qr.toString(text, { type: 'svg', margin: 1, errorCorrectionLevel: 'M' });
      if (live) setSrc(`data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg)}`);
    });
    return () => {
      live = false;
    };
  }, [text]);
  return src;
}

function RecoveryCodes({ codes, onDone }: { codes: string[]; onDone: () => void }) {
  return (
    <div className="flex flex-col gap-3">
      <Notice tone="success">
        Keep these recovery codes somewhere safe, away from your phone. Each one signs you in once if you lose
        the authenticator. They are shown only now.
      </Notice>
      <ol
        aria-label="Recovery codes"
        className="value grid grid-cols-1 gap-1 rounded-md border border-rule bg-paper p-3 sm:grid-cols-2"
      >
        {codes.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ol>
      <Button className="self-start" onClick={onDone}>
        I have kept them
      </Button>
    </div>
  );
}

/** A password field and a button, for the steps that ask for the password again. */
function PasswordStep({
  label,
  pending,
  onSubmit,
  variant = 'primary',
}: {
  label: string;
  pending: boolean;
  /** Sends the password; the refusal comes back through onError. */
  onSubmit: (password: string, onError: (e: ApiError) => void) => void;
  variant?: 'primary' | 'danger' | 'quiet';
}) {
  const form = useZodForm(passwordBody, { defaultValues: { password: '' } });
  // A wrong password is a refusal of the field itself, whatever the server calls it.
  const submit = form.handleSubmit(({ password }) =>
    onSubmit(password, (e) =>
      e.fields.length
        ? showServerError(form, e)
        : form.setError('password', { type: 'server', message: e.message }),
    ),
  );
  return (
    <form onSubmit={submit} aria-label={label} className="flex flex-col gap-3" noValidate>
      <Field
        label="Your password"
        type="password"
        autoComplete="current-password"
        {...form.register('password')}
        error={form.formState.errors.password?.message}
      />
      <FormProblem formState={form.formState} />
      <Button
        type="submit"
        variant={variant}
        className="self-start"
        disabled={pending}
        whyDisabled="Checking…"
      >
        {label}
      </Button>
    </form>
  );
}

export function AuthenticatorPanel({ account }: { account: AccountInfo }) {
  const start = useStartTotpSetup();
  const confirm = useConfirmTotp();
  const renew = useNewRecoveryCodes();
  const disable = useDisableTotp();
  const codeForm = useZodForm(codeBody, { defaultValues: { code: '' } });
  const [shownCodes, setShownCodes] = useState<string[]>();
  const [action, setAction] = useState<'renew' | 'disable'>();
  const qr = useQrImage(start.data?.otpauthUrl);
  const { enabled, required, recoveryCodesLeft } = account.secondFactor;

  const confirmCode = codeForm.handleSubmit((body) =>
    confirm.mutate(body, {
      onSuccess: (r) => {
        setShownCodes(r.recoveryCodes);
        start.reset();
        codeForm.reset();
      },
      onError: (e) => showServerError(codeForm, e),
    }),
  );

  return (
    <section
      aria-label="Authenticator codes"
      className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-5"
    >
      <h2 className="text-lg font-semibold">Authenticator codes</h2>
      <p className="text-sm">
        With an authenticator app on your phone, signing in takes your password and a six-digit code that
        changes every 30 seconds, so a leaked password alone is not enough.
      </p>
      {required && !enabled && (
        <Notice tone="error">
          The shop requires authenticator codes for your role. Set one up to go on using Benchwright.
        </Notice>
      )}

      {shownCodes ? (
        <RecoveryCodes codes={shownCodes} onDone={() => setShownCodes(undefined)} />
      ) : enabled ? (
        <>
          <p className="text-sm">
            <strong>On.</strong> {recoveryCodesLeft} of 10 recovery codes left
            {recoveryCodesLeft <= 3 ? ' — make new ones soon.' : '.'}
          </p>
          {action === 'renew' ? (
            <PasswordStep
              label="Make new recovery codes"
              pending={renew.isPending}
              onSubmit={(password, onError) =>
                renew.mutate(
                  { password },
                  {
                    onSuccess: (r) => {
                      setShownCodes(r.recoveryCodes);
                      setAction(undefined);
                    },
                    onError,
                  },
                )
              }
            />
          ) : action === 'disable' ? (
            <PasswordStep
              label="Turn authenticator codes off"
              variant="danger"
              pending={disable.isPending}
              onSubmit={(password, onError) =>
                disable.mutate({ password }, { onSuccess: () => setAction(undefined), onError })
              }
            />
          ) : (
            <div className="flex flex-wrap gap-3">
              <Button variant="quiet" onClick={() => setAction('renew')}>
                New recovery codes
              </Button>
              {!required && (
                <Button variant="danger" onClick={() => setAction('disable')}>
                  Turn off
                </Button>
              )}
            </div>
          )}
        </>
      ) : start.data ? (
        <form
          onSubmit={confirmCode}
          aria-label="Finish setting up the authenticator"
          className="flex flex-col gap-4"
          noValidate
        >
          <ol className="list-decimal space-y-1 pl-5 text-sm">
            <li>Open your authenticator app and add an account by scanning this code.</li>
            <li>Type the six-digit code the app then shows for Benchwright.</li>
          </ol>
          {qr ? (
            <img
              src={qr}
              alt="QR code to scan with the authenticator app"
              width={200}
              height={200}
              className="rounded border border-rule bg-white p-2"
            />
          ) : (
            <p>Drawing the QR code…</p>
          )}
          <p className="text-sm">
            Cannot scan? Enter this key by hand (time-based, 6 digits):{' '}
            <code data-testid="totp-key" className="break-all rounded bg-paper px-1 font-mono">
              {start.data.secret}
            </code>
          </p>
          <FormProblem formState={codeForm.formState} />
          <Field
            label="Code from the app"
            autoComplete="one-time-code"
            inputMode="numeric"
            {...codeForm.register('code')}
            error={codeForm.formState.errors.code?.message}
          />
          <Button
            type="submit"
            className="self-start"
            disabled={confirm.isPending}
            whyDisabled="Checking the code…"
          >
            Turn on authenticator codes
          </Button>
        </form>
      ) : (
        <PasswordStep
          label="Set up an authenticator"
          pending={start.isPending}
          onSubmit={(password, onError) => start.mutate({ password }, { onError })}
        />
      )}
    </section>
  );
}
