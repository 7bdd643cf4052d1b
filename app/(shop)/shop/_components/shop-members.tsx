'use client';
/** Members and invitations: owners invite by e-mail with a role, change roles and remove members. */
import { shopKeys } from '@/components/data/shop/keys';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, Select } from '@/components/ui/field';
import { call, errorText } from '@/components/data/api';
import { ROLE_NAMES, type RoleName } from '@/server/permissions';
import { cancelInvitation, changeMember, getShop, invite as inviteRoute, removeMember } from '@/server/api/routes/shop';



export function ShopMembers({ isOwner, selfMemberId }: { isOwner: boolean; selfMemberId: string }) {
  const qc = useQueryClient();
  const shop = useQuery({ queryKey: shopKeys.current, queryFn: () => call(getShop) });
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<RoleName>('technician');
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const done = (text: string) => {
    setMessage({ tone: 'ok', text });
    return qc.invalidateQueries({ queryKey: shopKeys.current });
  };
  const fail = (e: unknown) => setMessage({ tone: 'error', text: errorText(e) });

  const invite = useMutation({
    mutationFn: () => call(inviteRoute, { json: { email, role } }),
    onSuccess: () => {
      setEmail('');
      return done(`Invitation sent to ${email}.`);
    },
    onError: fail,
  });
  const changeRole = useMutation({
    mutationFn: (v: { id: string; role: RoleName }) => call(changeMember, { params: { memberId: v.id }, json: { role: v.role } }),
    onSuccess: () => done('Role changed.'),
    onError: fail,
  });
  const remove = useMutation({
    mutationFn: (id: string) => call(removeMember, { params: { memberId: id } }),
    onSuccess: () => done('Member removed.'),
    onError: fail,
  });
  const cancel = useMutation({
    mutationFn: (id: string) => call(cancelInvitation, { params: { invitationId: id } }),
    onSuccess: () => done('Invitation cancelled.'),
    onError: fail,
  });

  return (
    <div className="flex flex-col gap-4">
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      <section className="rounded-2xl border border-line bg-surface p-5">
        <h2 className="mb-2 text-lg font-bold">Members</h2>
        <ul className="flex flex-col divide-y divide-line">
          {(shop.data?.members ?? []).map((m) => (
            <li key={m.id} className="flex flex-wrap items-center gap-3 py-2">
              <div className="flex-1">
                <div className="font-bold">
                  {m.name} {m.id === selfMemberId && <span className="text-sm text-muted">(you)</span>}
                </div>
                <div className="figures text-sm text-muted">{m.email}</div>
              </div>
              {isOwner ? (
                <>
                  <label className="sr-only" htmlFor={`role-${m.id}`}>
                    Role of {m.name}
                  </label>
                  <Select id={`role-${m.id}`} className="w-44" value={m.role} onChange={(e) => changeRole.mutate({ id: m.id, role: e.target.value as RoleName })}>
                    {ROLE_NAMES.map((r) => (
                      <option key={r} value={r}>
                        {r}
                      </option>
                    ))}
                  </Select>
                  <Button variant="secondary" onClick={() => confirm(`Remove ${m.name} from the shop?`) && remove.mutate(m.id)}>
                    Remove
                  </Button>
                </>
              ) : (
                <span className="rounded-md bg-raised px-2 py-1 font-bold">{m.role}</span>
              )}
            </li>
          ))}
        </ul>
      </section>
      {isOwner && (
        <section className="rounded-2xl border border-line bg-surface p-5">
          <h2 className="mb-2 text-lg font-bold">Invite someone</h2>
          <form
            className="grid gap-x-3 md:grid-cols-[1fr_12rem_auto] md:items-start"
            onSubmit={(e) => {
              e.preventDefault();
              setMessage(null);
              invite.mutate();
            }}
          >
            <Field id="invite-email" label="E-mail">
              <Input id="invite-email" type="email" value={email} onChange={(e) => setEmail(e.target.value)} />
            </Field>
            <Field id="invite-role" label="Role">
              <Select id="invite-role" value={role} onChange={(e) => setRole(e.target.value as RoleName)}>
                {ROLE_NAMES.map((r) => (
                  <option key={r} value={r}>
                    {r}
                  </option>
                ))}
              </Select>
            </Field>
            <Button type="submit" className="md:mt-7" disabled={invite.isPending || !email}>
              Send invitation
            </Button>
          </form>
          {(shop.data?.invitations ?? []).length > 0 && (
            <>
              <h3 className="mt-4 font-bold">Waiting for an answer</h3>
              <ul className="flex flex-col divide-y divide-line">
                {shop.data!.invitations.map((i) => (
                  <li key={i.id} className="flex items-center gap-3 py-2">
                    <span className="figures flex-1">{i.email}</span>
                    <span>{i.role}</span>
                    <Button variant="ghost" onClick={() => cancel.mutate(i.id)}>
                      Cancel
                    </Button>
                  </li>
                ))}
              </ul>
            </>
          )}
        </section>
      )}
    </div>
  );
}
