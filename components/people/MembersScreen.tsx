import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import {
  Button,
  Choice,
  ConfirmButton,
  Form,
  FormError,
  FormField,
  SubmitButton,
  useApiForm,
} from '@/components/forms';
import { inviteSchema } from '@/components/forms/schemas';
import {
  useInvitationsQuery,
  useInviteMutation,
  useMeQuery,
  useMembersQuery,
  useRemoveMemberMutation,
  useRoleMutation,
  useWithdrawInvitationMutation,
  type Member,
  type Role,
  type ShopSummary,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { ShopTabs } from '@/components/shop/ShopTabs';
import { space, type } from '@/components/theme';
import { Notice, Panel, useDocumentTitle } from '@/components/ui';

const ROLE_OPTIONS: readonly { value: Role; label: string }[] = [
  { value: 'owner', label: 'Owner' },
  { value: 'member', label: 'Member' },
  { value: 'viewer', label: 'Viewer' },
];

/** Who is in the shop and with which role; owners invite, change roles and remove. */
export function MembersScreen() {
  const shop = useFrameShop();
  useDocumentTitle('Members', shop.name);
  return <MembersBody shop={shop} />;
}

function MembersBody({ shop }: { shop: ShopSummary }) {
  const owner = shop.role === 'owner';
  const members = useMembersQuery(shop.id, shop.role !== 'viewer');
  const myId = useMeQuery().data?.user.id;
  return (
    <>
      <ShopTabs shop={shop} current="members" />
      <Text style={type.small}>
        Owners manage everything, members acknowledge alarms and log care, viewers only look.
      </Text>
      {shop.role === 'viewer' ? (
        <Notice title="Members">Viewers do not see the member list.</Notice>
      ) : members.isError ? (
        <Notice title="Members could not be loaded">{members.error.message}</Notice>
      ) : !members.data ? (
        <Notice title="Loading members…" />
      ) : (
        <View style={styles.list} testID="member-list">
          {members.data.members.map((m) => (
            <MemberRow
              key={m.userId}
              member={m}
              shopId={shop.id}
              canManage={owner}
              isMe={m.userId === myId}
            />
          ))}
        </View>
      )}
      {owner ? <InvitePanel shopId={shop.id} /> : null}
    </>
  );
}

interface MemberRowProps {
  member: Member;
  shopId: string;
  canManage: boolean;
  isMe: boolean;
}

function MemberRow({ member, shopId, canManage, isMe }: MemberRowProps) {
  const role = useRoleMutation(shopId);
  const remove = useRemoveMemberMutation(shopId);
  const busy = role.isPending || remove.isPending;
  return (
    <Panel testID="member-row">
      <View>
        <Text style={type.heading} role="heading" aria-level={2}>
          {member.name}
          {isMe ? ' (you)' : ''}
        </Text>
        <Text style={type.small}>{member.email}</Text>
      </View>
      {canManage ? (
        <>
          <Choice
            label={`Role of ${member.name}`}
            options={ROLE_OPTIONS}
            value={member.role}
            disabled={busy}
            onChange={(next) =>
              next !== member.role && role.mutate({ userId: member.userId, role: next })
            }
            testID="member-role"
          />
          {isMe ? null : (
            <ConfirmButton
              label="Remove"
              question={`Remove ${member.name} from the shop? They lose access at once.`}
              disabled={busy}
              onConfirm={() => remove.mutate(member.userId)}
              testID="member-remove"
            />
          )}
        </>
      ) : (
        <Text style={type.body}>{member.role}</Text>
      )}
      <FormError message={role.error?.message ?? remove.error?.message} />
    </Panel>
  );
}

function InvitePanel({ shopId }: { shopId: string }) {
  const invite = useInviteMutation(shopId);
  const invitations = useInvitationsQuery(shopId);
  const withdraw = useWithdrawInvitationMutation(shopId);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { form, control, submit, sending, formError, done } = useApiForm<{
    email: string;
    role: Role;
  }>({
    schema: inviteSchema,
    defaultValues: { email: '', role: 'member' },
    fields: ['email', 'role'],
    send: async (values) => {
      const created = await invite.mutateAsync({ email: values.email.trim(), role: values.role });
      setSentTo(created.email);
      form.reset({ email: '', role: values.role });
    },
  });

  return (
    <Panel
      title="Invite someone"
      hint="They get an e-mail with a link that works once, for 7 days."
    >
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="email"
          label="Their e-mail"
          testID="invite-email"
          autoCapitalize="none"
          inputMode="email"
          editable={!sending}
        />
        <Controller
          control={control}
          name="role"
          render={({ field }) => (
            <Choice
              label="Role"
              options={ROLE_OPTIONS}
              value={field.value}
              onChange={field.onChange}
              disabled={sending}
              testID="invite-role"
            />
          )}
        />
        <FormError message={formError} testID="invite-error" />
        {done && sentTo ? (
          <Text style={type.body} role="status" testID="invite-sent">
            Invitation sent to {sentTo}.
          </Text>
        ) : null}
        <SubmitButton
          label="Send invitation"
          sendingLabel="Sending…"
          sending={sending}
          onPress={submit}
          testID="invite-submit"
        />
      </Form>
      {invitations.data && invitations.data.invitations.length > 0 ? (
        <View style={styles.pending} testID="invitation-list">
          <Text style={type.label}>Waiting for an answer</Text>
          {invitations.data.invitations.map((inv) => (
            <View key={inv.id} style={styles.pendingRow}>
              <Text style={[type.body, styles.address]}>
                {inv.email} · {inv.role}
              </Text>
              <Button
                label="Withdraw"
                accessibilityLabel={`Withdraw the invitation to ${inv.email}`}
                variant="quiet"
                disabled={withdraw.isPending}
                onPress={() => withdraw.mutate(inv.id)}
              />
            </View>
          ))}
        </View>
      ) : null}
    </Panel>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  form: { gap: space.lg },
  pending: { gap: space.sm },
  // On a phone a long address wraps, breaking inside itself if it must, and the button moves
  // under it rather than off the card.
  pendingRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  address: { flexGrow: 1, flexShrink: 1, flexBasis: 160, minWidth: 0 },
});
