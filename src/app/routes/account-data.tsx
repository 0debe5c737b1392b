import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { PageHeader, Section } from '@/components/ui/page-header';
import { buttonClasses, linkClasses } from '@/components/ui/button';
import { ACCOUNT_EXPORT_HREF } from '@/features/account/api/export-account';

/** A person's own data: what the download holds, the download, and how to have the account removed (ASVS 8.3.2). */
export function AccountDataRoute() {
  return (
    <>
      <title>Your data · Starledger</title>
      <PageHeader
        eyebrow="Your account"
        title="Your data"
        description={
          <>
            What Starledger records about you, and why, is in the{' '}
            <Link to={paths.privacy.getHref()} className={linkClasses}>
              privacy notice
            </Link>
            .
          </>
        }
      />
      <Section title="Download">
        <p className="mb-3 max-w-prose text-sm">
          One JSON file with your account (name, e-mail address, whether the second factor is on), your projects and roles, where you are
          signed in, your mail preferences, your API tokens by name and dates, and every trail entry you made or that concerns your account.
        </p>
        <p className="mb-4 max-w-prose text-sm text-ink-soft">
          It holds no password, token, second-factor secret or recovery code, so it opens nothing; keep it as you would keep your mail.
        </p>
        <a href={ACCOUNT_EXPORT_HREF} download className={buttonClasses('secondary')}>
          Download your data
        </a>
      </Section>
      <Section title="Removing your account" className="mt-10">
        <p className="max-w-prose text-sm">
          Starledger has no button to delete an account. Ask the people who run this site (its site admins or the observatory) to remove it or to
          correct your name or address. Work you signed stays in its project’s trail, as the record of who did it.
        </p>
      </Section>
    </>
  );
}
