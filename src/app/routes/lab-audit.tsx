import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { useLabAudit, labAuditPath } from '../../features/audit/api/get-lab-audit';
import { auditExportUrl, emptyAuditFilters } from '../../features/audit/api/audit-filters';
import { AuditLog } from '../../features/audit/components/audit-log';
import { RequireSession } from '../require-session';
import { paths } from '../paths';

export function Component() {
  const { slug = '' } = useParams();
  return <RequireSession>{() => <LabAudit slug={slug} />}</RequireSession>;
}

function LabAudit({ slug }: { slug: string }) {
  const [filters, setFilters] = useState(emptyAuditFilters);
  const query = useLabAudit(slug, filters);
  return (
    <Page wide title="Audit log" lead={<span>Who did what in this lab, and when. <Link to={paths.lab(slug)}>Back to the lab</Link></span>}>
      <AuditLog query={query} filters={filters} onFilters={setFilters} exportUrl={auditExportUrl(`${labAuditPath(slug)}/export`, filters)} />
    </Page>
  );
}
