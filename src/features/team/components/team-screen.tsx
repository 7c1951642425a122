import { PageHeader, Panel } from '@/components/ui/page-header';
import { useCan } from '@/lib/auth';
import { InstrumentsBlock } from './instruments';
import { InvitationsList, InviteForm } from './invitations';
import { LabelClashes } from './label-clashes';
import { MembersTable } from './members-table';
import { ProfilesBlock } from './profiles';

/** Admins see everything; QA leads see the profiles and instruments they keep (the server refuses them the rest). */
export function TeamScreen() {
  const isAdmin = useCan('admin');
  return (
    <div>
      <PageHeader
        title={isAdmin ? 'Team & settings' : 'Profiles & instruments'}
        documentTitle="Team"
        description={
          isAdmin
            ? 'Members and their roles, invitations, tolerance profiles and the instrument register.'
            : 'Tolerance profiles and the instrument register with calibration dates.'
        }
      />
      <div className="space-y-6">
        {isAdmin && (
          <>
            <LabelClashes />
            <Panel id="team-members" title="Members">
              <MembersTable />
            </Panel>
            <Panel id="team-invite" title="Invite someone">
              <InviteForm />
            </Panel>
            <Panel id="team-invitations" title="Invitations">
              <InvitationsList />
            </Panel>
          </>
        )}
        <Panel id="team-profiles" title="Tolerance profiles">
          <ProfilesBlock />
        </Panel>
        <Panel id="team-instruments" title="Instruments">
          <InstrumentsBlock />
        </Panel>
      </div>
    </div>
  );
}
