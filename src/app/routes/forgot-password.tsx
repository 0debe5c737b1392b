import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { PublicPage } from '@/components/layouts/public-page';
import { linkClasses } from '@/components/ui/button';
import { ForgotPasswordForm } from '@/features/auth/components/forgot-password-form';

export function ForgotPasswordRoute() {
  return (
    <PublicPage title="Forgot your password?" subtitle="We send a link to set a new one. It works once, within an hour.">
      <ForgotPasswordForm />
      <p className="mt-6 text-center text-sm">
        <Link to={paths.auth.signIn.getHref()} className={linkClasses}>
          Back to sign-in
        </Link>
      </p>
    </PublicPage>
  );
}
