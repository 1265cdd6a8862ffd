import { Page, Section } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useAdminPlans } from '../../features/billing/api/get-admin-plans';
import { PlansTable } from '../../features/billing/components/plans-table';
import { PlanForm } from '../../features/billing/components/plan-form';
import { RequireSession } from '../require-session';

export function Component() {
  return <RequireSession admin>{() => <AdminPlans />}</RequireSession>;
}

function AdminPlans() {
  const plans = useAdminPlans();
  return (
    <Page wide title="Storage plans" lead="The tiers lab leads can choose. Each plan is mirrored as a product with a monthly price at the payment provider; archived plans stay with labs already on them but are no longer offered.">
      <Section title="Catalogue">
        <QueryState query={plans}>{(p) => <PlansTable plans={p} />}</QueryState>
      </Section>
      <Section title="Add a plan">
        <PlanForm />
      </Section>
    </Page>
  );
}
