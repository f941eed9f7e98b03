import { ErrorNotice, Progress } from '../components/Notice';
import { Panel } from '../components/Panel';
import { can, useMe } from '../features/auth';
import { InvitationList, InviteForm, MemberList, useInvitations, useMembers } from '../features/team';
import { useCurrentCruise } from './CruiseLayout';

export default function CruiseTeam() {
  const cruise = useCurrentCruise();
  const me = useMe();
  const manage = can.manageTeam(cruise.role);
  const members = useMembers(cruise.id);
  const invitations = useInvitations(cruise.id, manage);

  return (
    <div className={`grid gap-5 ${manage ? 'xl:grid-cols-[minmax(0,1.5fr)_minmax(0,1fr)]' : ''}`}>
      <div className="flex flex-col gap-5">
        <Panel
          title="Members"
          titleId="members"
          actions={members.isSuccess && <span className="font-mono text-xs text-ink-muted">{members.data.length}</span>}
        >
          {members.isPending && <Progress label="Loading the team…" />}
          {members.isError && (
            <div className="p-4">
              <ErrorNotice error={members.error} title="The team could not be loaded" />
            </div>
          )}
          {members.isSuccess && (
            <MemberList
              cruiseId={cruise.id}
              members={members.data}
              canManage={manage}
              currentUserId={me.data?.user.id}
            />
          )}
        </Panel>
        {manage && (
          <Panel title="Invitations" titleId="invitations">
            {invitations.isPending && <Progress label="Loading the invitations…" />}
            {invitations.isError && (
              <div className="p-4">
                <ErrorNotice error={invitations.error} title="The invitations could not be loaded" />
              </div>
            )}
            {invitations.isSuccess && <InvitationList invitations={invitations.data} />}
          </Panel>
        )}
      </div>
      {manage && (
        <Panel title="Invite a member" titleId="invite" className="self-start">
          <InviteForm cruiseId={cruise.id} cruiseName={cruise.name} />
        </Panel>
      )}
    </div>
  );
}
