import { useState } from 'react';
import { Button } from '../../components/ui/button';
import { PageHeader } from '../../components/ui/page-header';
import { SiteFormDialog } from '../../features/sites/components/site-form';
import { SiteList } from '../../features/sites/components/site-list';
import { useAbilities } from '../../lib/session';

export default function SitesPage() {
  const { canEdit } = useAbilities();
  const [creating, setCreating] = useState(false);
  return (
    <section aria-labelledby="sites-title" className="space-y-5">
      <PageHeader
        title="Sites"
        titleId="sites-title"
        subtitle="Buildings and job locations, each with its branch circuits."
        actions={canEdit ? <Button onClick={() => setCreating(true)}>New site</Button> : null}
      />
      <SiteList />
      {creating ? <SiteFormDialog open onClose={() => setCreating(false)} /> : null}
    </section>
  );
}
