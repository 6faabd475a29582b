import { useNavigate, useParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useToast } from '../../components/ui/toast';
import { useProject } from '../../features/projects/api/get-project';
import { EditProjectForm } from '../../features/projects/components/project-form';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function EditSiteRoute() {
  const projectId = idParam(useParams(), 'projectId');
  const project = useProject(projectId);
  const navigate = useNavigate();
  const toast = useToast();
  usePageTitle(project.data ? `Edit ${project.data.name}` : 'Edit site');
  return (
    <>
      <TextLink to={`/sites/${projectId}`}>← The site</TextLink>
      <PageQuery query={project} what="the site">
        {(site) => (
          <>
            <PageHeader title={`Edit ${site.name}`} lead="Orders already sent keep the access details they were sent with." />
            {site.archived_at ? (
              <Alert tone="info" live={false} title="This site is archived">
                Restore it from its page before editing.
              </Alert>
            ) : (
              <EditProjectForm
                project={site}
                onSaved={(saved) => {
                  toast.show(`${saved.name} is saved.`, 'success');
                  navigate(`/sites/${saved.id}`);
                }}
              />
            )}
          </>
        )}
      </PageQuery>
    </>
  );
}
