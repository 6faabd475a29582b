import { useNavigate } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useToast } from '../../components/ui/toast';
import { CreateProjectForm } from '../../features/projects/components/project-form';
import { usePageTitle } from '../../lib/use-page-title';

export function NewSiteRoute() {
  usePageTitle('New site');
  const navigate = useNavigate();
  const toast = useToast();
  return (
    <>
      <TextLink to="/sites">← Sites</TextLink>
      <PageHeader title="New site" lead="Where the roofs are, who to ring, and what a lorry finds when it arrives." />
      <CreateProjectForm
        onCreated={(project) => {
          toast.show(`${project.name} is added. Next, its roof schedule.`, 'success');
          navigate(`/sites/${project.id}`);
        }}
      />
    </>
  );
}
