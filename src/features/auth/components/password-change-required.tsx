import { passwordChangeReasons, type PasswordChangeReason } from '@shared/schemas/auth';
import { PublicPage } from '@/components/layouts/public-page';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ChangePasswordForm } from './change-password-form';

/**
 * What a signed-in account that must choose a new password sees instead of
 * the workbook (the server refuses it everything else: 403
 * password_change_required): why, the change-password form, and a way out.
 * Once the new password is set the session's answer no longer asks, and the
 * workbook appears where the person was going.
 */
export function PasswordChangeRequired({
  email,
  reason,
  signingOut,
  onSignOut,
}: {
  email: string;
  reason: PasswordChangeReason;
  signingOut: boolean;
  onSignOut: () => void;
}) {
  return (
    <PublicPage title="Choose a new password" subtitle={`Signed in as ${email}.`}>
      <Alert kind="caution" title="Your password must change before you go on." className="mb-6">
        {passwordChangeReasons[reason]}
      </Alert>
      <ChangePasswordForm email={email} />
      <p className="mt-6 text-center text-sm">
        <Button variant="quiet" onClick={onSignOut} disabled={signingOut}>
          {signingOut ? 'Signing out…' : 'Sign out instead'}
        </Button>
      </p>
    </PublicPage>
  );
}
