import { useUser } from '@/lib/auth';
import { PageHeader, Section } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { EmptyState } from '@/components/ui/empty-state';
import { QueryError } from '@/components/errors/query-error';
import { useProjects } from '@/features/projects/api/get-projects';
import { ProjectList } from '@/features/projects/components/project-list';
import { CreateProjectForm } from '@/features/projects/components/create-project-form';
import { AwaitingReview } from '@/features/projects/components/awaiting-review';
import { RecentActivity } from '@/features/trail/components/recent-activity';

export function HomeRoute() {
  const user = useUser();
  const projects = useProjects();

  return (
    <>
      <title>My projects · Starledger</title>
      <PageHeader
        eyebrow={user.isSiteAdmin ? `${user.name} · site administrator` : user.name}
        title="My projects"
        description="The observing programmes you belong to, with your role and the number of targets in each."
      />
      {projects.isPending ? <StatusLine>Loading your projects…</StatusLine> : null}
      {projects.isError ? <QueryError what="Your projects" error={projects.error} onRetry={() => void projects.refetch()} /> : null}
      {projects.data && projects.data.length === 0 ? (
        <EmptyState title="You are not a member of any project">
          {user.isSiteAdmin
            ? 'Projects you create appear here only if you are a member: name yourself as lead astronomer, or ask the project’s lead to add you.'
            : 'A project’s lead astronomer adds you to it; once they have, it appears here.'}
        </EmptyState>
      ) : null}
      {projects.data?.some((p) => p.awaitingReview !== null) ? (
        <Section title="Awaiting review" className="mb-10">
          <AwaitingReview projects={projects.data} />
        </Section>
      ) : null}
      {projects.data && projects.data.length > 0 ? <ProjectList projects={projects.data} /> : null}
      {projects.data && projects.data.length > 0 ? (
        <Section title="Recent activity" className="mt-12">
          <p className="mb-3 text-sm text-ink-soft">The newest entries of the review trail in your projects. Times in UTC.</p>
          <RecentActivity />
        </Section>
      ) : null}
      {user.isSiteAdmin ? (
        <Section title="New project" className="mt-12 max-w-3xl">
          <CreateProjectForm />
        </Section>
      ) : null}
    </>
  );
}
