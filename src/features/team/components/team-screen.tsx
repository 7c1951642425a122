import { PageHeader, Panel } from '@/components/ui/page-header';
import { InvitationsList, InviteForm } from './invitations';
import { MembersTable } from './members-table';

export function TeamScreen() {
  return (
    <div>
      <PageHeader title="Team" description="Members and their roles, and invitations to join. Tolerance profiles and instruments will be kept here too." />
      <div className="space-y-6">
        <Panel id="team-members" title="Members">
          <MembersTable />
        </Panel>
        <Panel id="team-invite" title="Invite someone">
          <InviteForm />
        </Panel>
        <Panel id="team-invitations" title="Invitations">
          <InvitationsList />
        </Panel>
        {/* Later blocks: tolerance profiles (qa), instruments and calibration (qa). */}
      </div>
    </div>
  );
}
