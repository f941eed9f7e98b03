export {
  invitationKeys,
  membersQuery,
  invitationsQuery,
  useMembers,
  useInvitations,
  useInviteMember,
  useChangeRole,
  useRemoveMember,
  useInvitation,
  useAcceptInvitation,
} from './api';
export { MemberList } from './components/MemberList';
export { InviteForm } from './components/InviteForm';
export { InvitationList } from './components/InvitationList';
export { memberSchema, invitationSchema, invitationPreviewSchema } from './types';
export type { Member, Invitation, InvitationPreview } from './types';
