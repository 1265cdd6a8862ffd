import { Link, useParams } from 'react-router-dom';
import { Page, Section } from '../../components/page';
import { DemoBadge } from '../../components/badge';
import { QueryState } from '../../components/query-state';
import { useLab } from '../../features/labs/api/get-lab';
import { LabMembers } from '../../features/labs/components/lab-members';
import { InviteForm } from '../../features/labs/components/invite-form';
import { InvitationList } from '../../features/labs/components/invitation-list';
import { RoleBadge } from '../../features/labs/components/role-badge';
import { labRoleCan } from '../../../shared/lab-roles';
import { LinkButton } from '../../components/button';
import { paths } from '../paths';
import { RorIdentifier } from '../../components/identifier';
import { MemberListingToggle } from '../../features/lab-profiles/components/member-listing-toggle';
import { LabDescriptionForm } from '../../features/lab-profiles/components/lab-description-form';

export function Component() {
  const { slug = '' } = useParams();
  const lab = useLab(slug);
  return (
    <QueryState query={lab}>
      {(l) => (
        <Page
          wide
          title={l.name}
          lead={
            <span className="flex flex-wrap items-center gap-2">
              {l.institution ? <span>{l.institution}</span> : null}
              {l.rorId ? <RorIdentifier rorId={l.rorId} label="ROR id" /> : null}
              <Link to={paths.labProfile(l.slug)}>Public page</Link>
              {l.isDemo ? <DemoBadge /> : null}
              {l.myRole ? (
                <span className="ml-2 flex items-center gap-1 text-sm">
                  Your role: <RoleBadge role={l.myRole} />
                </span>
              ) : null}
            </span>
          }
        >
          {l.description ? <p className="mb-8 max-w-3xl font-serif leading-relaxed">{l.description}</p> : null}
          {l.myRole ? (
            <p className="mb-8 flex flex-wrap gap-2">
              <LinkButton to={paths.labDatasets(l.slug)}>Datasets and drafts</LinkButton>
              {labRoleCan(l.myRole, { release: ['review'] }) ? (
                <LinkButton variant="secondary" to={paths.reviewQueue(l.slug)}>Review queue</LinkButton>
              ) : null}
              {labRoleCan(l.myRole, { accessRequest: ['decide'] }) ? (
                <LinkButton variant="secondary" to={paths.labAccessRequests(l.slug)}>Access requests</LinkButton>
              ) : null}
              {labRoleCan(l.myRole, { billing: ['manage'] }) ? (
                <LinkButton variant="secondary" to={paths.labStorage(l.slug)}>Storage and billing</LinkButton>
              ) : null}
              {labRoleCan(l.myRole, { lab: ['update'] }) ? (
                <LinkButton variant="secondary" to={paths.labAudit(l.slug)}>Audit log</LinkButton>
              ) : null}
            </p>
          ) : null}
          <Section title={`Members (${l.memberCount})`}>
            <LabMembers lab={l} />
          </Section>
          {l.myRole ? (
            <Section title="Your listing on the public page">
              <MemberListingToggle slug={l.slug} />
            </Section>
          ) : null}
          {labRoleCan(l.myRole, { lab: ['update'] }) ? (
            <Section title="Description on the public page">
              <LabDescriptionForm slug={l.slug} description={l.description} />
            </Section>
          ) : null}
          {labRoleCan(l.myRole, { invitation: ['create'] }) ? (
            <>
              <Section title="Invite a member">
                <InviteForm slug={l.slug} />
              </Section>
              <Section title="Invitations">
                <InvitationList slug={l.slug} invitations={l.invitations ?? []} />
              </Section>
            </>
          ) : null}
        </Page>
      )}
    </QueryState>
  );
}
