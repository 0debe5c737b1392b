import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { PublicPage } from '@/components/layouts/public-page';
import { linkClasses } from '@/components/ui/button';

/*
 * The privacy notice (ASVS 8.3.3). The observatory that runs Starledger is
 * responsible for the data and must adapt this text to its own situation and
 * law: at least OPERATOR below, and any retention or setting it changed
 * (SESSION_MAX_HOURS, SESSION_IDLE_MINUTES, PREVIEW_MAX_AGE_HOURS, how long
 * it keeps logs and backups). docs/data-protection.md is the policy behind
 * this text; keep the two in step, and rebuild (npm run build) after an edit.
 */
const OPERATOR = {
  /** Who runs this Starledger and decides what is done with the data. */
  who: 'the observatory that runs this Starledger site',
  /** Where people write with questions or requests about their data. */
  contact: 'the site admins of this Starledger, or the observatory’s office',
  /** Said until the operator has adapted the notice. */
  adapted: false,
};

function Part({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="mt-8">
      <h2 id={id} className="border-b border-rule pb-1 font-serif text-xl font-semibold">
        {title}
      </h2>
      <div className="mt-3 space-y-3 text-sm leading-relaxed">{children}</div>
    </section>
  );
}

const RECORDS: { what: string; why: string; kept: string }[] = [
  {
    what: 'Your account: name, e-mail address, a hash of your password (never the password itself), and, if you turn on the second factor, its secret (encrypted) and hashes of your recovery codes.',
    why: 'To know who you are when you sign in, to put your name beside your work and to send you mail.',
    kept: 'As long as the account exists.',
  },
  {
    what: 'Your projects and roles.',
    why: 'To decide what you may see and do in each project.',
    kept: 'As long as you are a member.',
  },
  {
    what: 'Sessions: when you signed in and were last active, the browser (its user-agent text) and the network address you signed in from.',
    why: 'To keep you signed in, and so that you can see where you are signed in and end a session you do not recognise.',
    kept: 'Until the session ends: 12 hours after signing in, after 30 minutes without use, or when you sign out.',
  },
  {
    what: 'The review trail: who made, changed, proposed, approved or rejected what and when, with the values before and after.',
    why: 'A measurement’s history must say who is answerable for each step of it; this is what the trail is for.',
    kept: 'With the project: entries are never changed or removed one by one.',
  },
  {
    what: 'Security log lines: sign-ins, failed sign-ins (with the e-mail address typed), refusals and errors, each with the time, the network address and the account.',
    why: 'To notice and look into misuse of accounts and of the site.',
    kept: 'As long as the operator keeps its server logs.',
  },
  {
    what: 'Counts of failed sign-ins, by account and by network address.',
    why: 'To slow down someone guessing passwords.',
    kept: 'Deleted after 7 days without another failure.',
  },
  {
    what: 'Mail preferences: whether you receive the weekly summary and review notices.',
    why: 'To send you only the mail you chose.',
    kept: 'As long as the account exists.',
  },
  {
    what: 'Uploaded files and their previews.',
    why: 'To keep the source of every measurement; a preview lets you check a file before committing it.',
    kept: 'Files with the project; an uncommitted preview 48 hours.',
  },
];

/** What Starledger records about a person, why, for how long, who sees it and who is responsible. Reachable without signing in. */
export function PrivacyRoute() {
  return (
    <PublicPage wide title="Privacy notice" subtitle="What Starledger records about you, and why.">
      {OPERATOR.adapted ? null : (
        <p className="rounded-sm border border-rule bg-paper-deep px-4 py-3 text-sm">
          This is Starledger’s standard notice. The observatory that runs this site has not yet adapted it to its own situation and law, so
          what it says about retention and contacts may differ from what applies here. (For the operator: the text is in{' '}
          <code>src/app/routes/privacy.tsx</code>, explained in <code>docs/data-protection.md</code>.)
        </p>
      )}

      <Part id="privacy-responsible" title="Who is responsible">
        <p>
          Starledger is run by {OPERATOR.who}. It decides why and how the data below is used, and is responsible for it. Questions and
          requests about your data go to {OPERATOR.contact}.
        </p>
      </Part>

      <Part id="privacy-records" title="What is recorded, why, and for how long">
        <ul className="space-y-4">
          {RECORDS.map((r) => (
            <li key={r.what} className="border-l-2 border-rule pl-3">
              <p>{r.what}</p>
              <p className="mt-1 text-ink-soft">
                <span className="font-semibold text-ink">Why:</span> {r.why}
              </p>
              <p className="mt-1 text-ink-soft">
                <span className="font-semibold text-ink">Kept:</span> {r.kept}
              </p>
            </li>
          ))}
        </ul>
        <p>
          The times above are Starledger’s defaults; the operator may set others. Backups of the database hold all of the above for as long
          as the operator keeps them. Your browser keeps only the session cookie and your choice of theme.
        </p>
        <p>Starledger uses no advertising, analytics or tracking, and loads nothing from other sites.</p>
      </Part>

      <Part id="privacy-who-sees" title="Who can see it">
        <ul className="list-disc space-y-2 pl-5">
          <li>You see your own account, sessions, API tokens and mail preferences, and can download them with your part of the trail.</li>
          <li>Members of a project see each other’s names and roles, and the project’s trail as their role allows.</li>
          <li>Site admins see the list of accounts; each time they open it is recorded.</li>
          <li>The people who run the server can read the database, its backups and the logs.</li>
          <li>Nothing is sold or given to anyone else. Mail goes out through the operator’s mail server.</li>
        </ul>
      </Part>

      <Part id="privacy-rights" title="What you can do">
        <p>
          Once signed in, <strong>Your data</strong> under your account downloads everything above that concerns you as one file. To correct
          your name or address, or to have your account removed, write to {OPERATOR.contact}. Work you signed stays in the trail of its
          project, as a record of who did it.
        </p>
      </Part>

      <p className="mt-10 text-center text-sm">
        <Link to={paths.home.getHref()} className={linkClasses}>
          Back to Starledger
        </Link>
      </p>
    </PublicPage>
  );
}
