import { useNavigate } from 'react-router';
import { PageHeader } from '../../components/ui/page-header';
import { UploadForm } from '../../features/upload/components/upload-form';
import { paths } from '../../lib/paths';

export default function UploadPage() {
  const navigate = useNavigate();
  return (
    <section aria-labelledby="upload-title" className="space-y-5">
      <PageHeader
        title="Upload a CSV export"
        titleId="upload-title"
        subtitle="From a logger, a clamp meter or a script. The file is checked whole: a bad line is reported with its number and nothing is stored."
      />
      <UploadForm onDone={(result) => void navigate(paths.trace.href(result.trace.id))} />
    </section>
  );
}
