import { useState } from 'react';
import { Page } from '../../components/page';
import { adminAuditPath, useAdminAudit } from '../../features/audit/api/get-admin-audit';
import { auditExportUrl, emptyAuditFilters } from '../../features/audit/api/audit-filters';
import { AuditLog } from '../../features/audit/components/audit-log';
import { RequireSession } from '../require-session';

export function Component() {
  return <RequireSession admin>{() => <AdminAudit />}</RequireSession>;
}

function AdminAudit() {
  const [filters, setFilters] = useState(emptyAuditFilters);
  const query = useAdminAudit(filters);
  return (
    <Page wide title="Audit log" lead="Every recorded action on the platform, across all labs.">
      <AuditLog showLab query={query} filters={filters} onFilters={setFilters} exportUrl={auditExportUrl(`${adminAuditPath}/export`, filters)} />
    </Page>
  );
}
