import { roleCan } from '@shared/schemas/roles';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { ForbiddenMessage, NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { useTargetChoices } from '@/features/targets/api/get-target-choices';
import { RederiveButton } from '@/features/review/components/rederive-button';
import { ReviewQueue } from '@/features/review/components/review-queue';

function ReviewPage({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const canRead = roleCan(project.data?.myRole, 'readQueue');
  const targets = useTargetChoices(projectId, { enabled: canRead });

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  if (!canRead) {
    return <ForbiddenMessage detail="The review queue is for the lead astronomer, who decides, and observers, who follow it." />;
  }

  const { data } = project;
  const canReview = roleCan(data.myRole, 'review');

  return (
    <>
      <title>{`Review queue · ${data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={data.code}
        title="Review queue"
        description={
          canReview
            ? 'Proposed values beside the approved ones they would replace. Select one, several or a whole target, then approve or reject them with one note.'
            : 'Proposed values beside the approved ones they would replace, awaiting the lead astronomer’s decision.'
        }
        actions={roleCan(data.myRole, 'rederive') ? <RederiveButton projectId={projectId} className="text-right" /> : null}
      />
      <ReviewQueue projectId={projectId} canReview={canReview} targets={targets.data} />
    </>
  );
}

export function ReviewRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <ReviewPage key={projectId} projectId={projectId} />;
}
