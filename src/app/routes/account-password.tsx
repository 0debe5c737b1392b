import { PageHeader } from '@/components/ui/page-header';
import { useUser } from '@/lib/auth';
import { ChangePasswordForm } from '@/features/auth/components/change-password-form';

/** A signed-in person's new password; every other session of the account ends. */
export function AccountPasswordRoute() {
  const user = useUser();
  return (
    <>
      <title>Password · Starledger</title>
      <PageHeader
        eyebrow="Your account"
        title="Password"
        description="Choose a new password. Every other browser or device signed in as you is signed out; this one stays signed in."
      />
      <ChangePasswordForm email={user.email} />
    </>
  );
}
