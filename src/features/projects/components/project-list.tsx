import { Link } from 'react-router-dom';
import type { Project } from '@shared/schemas/projects';
import { roleLabels } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';

/** The projects the signed-in person can open, with their role in each. */
export function ProjectList({ projects }: { projects: Project[] }) {
  return (
    <LedgerTable aria-label="My projects">
      <LedgerHead>
        <tr>
          <LedgerHeaderCell scope="col">Code</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Project</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Site</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">My role</LedgerHeaderCell>
          <LedgerHeaderCell scope="col" numeric>
            Targets
          </LedgerHeaderCell>
        </tr>
      </LedgerHead>
      <LedgerBody>
        {projects.map((project) => (
          <LedgerRow key={project.id}>
            <LedgerCell className="font-semibold tracking-wider whitespace-nowrap text-brass-deep">{project.code}</LedgerCell>
            <LedgerCell>
              <Link to={paths.project.root.getHref(project.id)} className={`${linkClasses} font-serif text-base font-semibold`}>
                {project.name}
              </Link>
              {project.description ? <p className="mt-0.5 line-clamp-2 text-xs text-ink-soft">{project.description}</p> : null}
            </LedgerCell>
            <LedgerCell>{project.site.name}</LedgerCell>
            <LedgerCell>{project.myRole ? roleLabels[project.myRole] : 'Not a member'}</LedgerCell>
            <LedgerCell numeric>{project.targetCount}</LedgerCell>
          </LedgerRow>
        ))}
      </LedgerBody>
    </LedgerTable>
  );
}
