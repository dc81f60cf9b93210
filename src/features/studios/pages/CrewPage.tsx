import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { useParams } from 'react-router-dom'
import type { z } from 'zod'
import { formatDate } from '../../../../shared/dates'
import { crewInviteSchema } from '../../../../shared/schemas/studios'
import { Alert } from '../../../components/ui/Alert'
import { Badge } from '../../../components/ui/Badge'
import { Button } from '../../../components/ui/Button'
import { Card, EmptyState, PageHeader } from '../../../components/ui/Card'
import { Dialog } from '../../../components/ui/Dialog'
import { Field, TextInput } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { Table, Td, Th } from '../../../components/ui/Table'
import { applyServerErrors } from '../../../lib/forms'
import { useCrew, useInviteCrew, useRemoveCrewMember, useWithdrawInvite } from '../api/crew'
import { useStudio } from '../api/studios'
import { isMemberView, type CrewMember, type MemberStudio } from '../api/types'
import { ApiProblem } from '../components/ApiProblem'
import { StudioNav } from '../components/StudioNav'

/** /studios/:id/crew: who works the studio's board, who is invited, and inviting more. */
export function CrewPage() {
  const { id = '' } = useParams()
  const studio = useStudio(id)
  if (studio.isPending) return <Spinner label="Loading the studio…" />
  if (studio.isError) return <ApiProblem error={studio.error} what="this studio" />
  const found = studio.data
  if (!isMemberView(found) || found.myRole !== 'owner') {
    return (
      <Alert tone="warning" title="Only the studio’s owner manages its crew">
        Ask the owner if someone needs to join or leave.
      </Alert>
    )
  }
  return <Crew studio={found} />
}

type InviteInput = z.input<typeof crewInviteSchema>

function Crew({ studio }: { studio: MemberStudio }) {
  const crew = useCrew(studio.id)
  const invite = useInviteCrew(studio.id)
  const withdraw = useWithdrawInvite(studio.id)
  const remove = useRemoveCrewMember(studio.id)
  const [sentTo, setSentTo] = useState<string | null>(null)
  const [removing, setRemoving] = useState<CrewMember | null>(null)
  const [formError, setFormError] = useState<string | null>(null)
  const { register, handleSubmit, setError, reset, formState } = useForm<InviteInput, unknown, z.output<typeof crewInviteSchema>>({
    resolver: zodResolver(crewInviteSchema),
  })
  const zone = studio.timezone

  const onSubmit = handleSubmit(async (body) => {
    setFormError(null)
    setSentTo(null)
    try {
      const answer = await invite.mutateAsync(body)
      setSentTo(answer.email)
      reset({ email: '' })
    } catch (error) {
      setFormError(applyServerErrors(error, setError))
    }
  })

  return (
    <>
      <PageHeader
        title="Crew"
        lead={`${studio.name}. Crew post firings and move them along; prices, kilns’ limits, your terms and members stay with you.`}
      />
      <StudioNav studioId={studio.id} role="owner" />
      <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="space-y-6">
          {crew.isPending ? (
            <Spinner label="Loading the crew…" />
          ) : crew.isError ? (
            <ApiProblem error={crew.error} what="the crew" onRetry={() => crew.refetch()} />
          ) : (
            <>
              <section aria-labelledby="members-heading" className="space-y-2">
                <h2 id="members-heading" className="text-lg font-semibold">
                  Members
                </h2>
                {remove.isError && <Alert tone="danger">{remove.error.message}</Alert>}
                <Table caption="Members">
                  <thead>
                    <tr>
                      <Th>Name</Th>
                      <Th>E-mail</Th>
                      <Th>Since</Th>
                      <Th>
                        <span className="sr-only">Actions</span>
                      </Th>
                    </tr>
                  </thead>
                  <tbody className="divide-y divide-slip-100">
                    {crew.data.members.map((member) => (
                      <tr key={member.id} data-testid="crew-member">
                        <Td>
                          <span className="font-medium">{member.displayName}</span>{' '}
                          {member.role === 'owner' && <Badge tone="clay">Owner</Badge>}
                        </Td>
                        <Td className="break-all">{member.email}</Td>
                        <Td className="whitespace-nowrap">{formatDate(member.since, zone)}</Td>
                        <Td className="text-right">
                          {member.role !== 'owner' && (
                            <button
                              type="button"
                              onClick={() => setRemoving(member)}
                              className="rounded-control px-3 py-1.5 text-sm font-semibold text-danger-700 hover:bg-danger-50"
                            >
                              Remove
                            </button>
                          )}
                        </Td>
                      </tr>
                    ))}
                  </tbody>
                </Table>
              </section>
              <section aria-labelledby="invites-heading" className="space-y-2">
                <h2 id="invites-heading" className="text-lg font-semibold">
                  Invitations waiting
                </h2>
                {withdraw.isError && <Alert tone="danger">{withdraw.error.message}</Alert>}
                {crew.data.invites.length === 0 ? (
                  <EmptyState title="No invitations waiting">
                    An invitation shows here until it is accepted, withdrawn or expires.
                  </EmptyState>
                ) : (
                  <ul className="divide-y divide-slip-200 rounded-card border border-slip-200 bg-white">
                    {crew.data.invites.map((pending) => (
                      <li
                        key={pending.id}
                        className="flex flex-wrap items-center justify-between gap-2 px-4 py-3"
                        data-testid="crew-invite"
                      >
                        <div>
                          <p className="break-all font-medium">{pending.email}</p>
                          <p className="text-xs text-slip-500">Link works until {formatDate(pending.expiresAt, zone)}</p>
                        </div>
                        <Button
                          variant="secondary"
                          size="sm"
                          busy={withdraw.isPending && withdraw.variables === pending.id}
                          onClick={() => withdraw.mutate(pending.id)}
                        >
                          Withdraw
                        </Button>
                      </li>
                    ))}
                  </ul>
                )}
              </section>
            </>
          )}
        </div>
        <Card className="h-fit">
          <h2 className="font-semibold">Invite someone</h2>
          <p className="mt-1 text-sm text-slip-600">We mail them a link. Without an account they make one through it; it works once.</p>
          <form onSubmit={onSubmit} noValidate className="mt-4 space-y-3" aria-label="Invite crew">
            {formError && <Alert tone="danger">{formError}</Alert>}
            {sentTo && (
              <Alert tone="success" title="Invitation sent">
                A link is on its way to {sentTo}.
              </Alert>
            )}
            <Field label="Their e-mail" error={formState.errors.email?.message}>
              {(a11y) => <TextInput {...a11y} type="email" autoComplete="off" {...register('email')} />}
            </Field>
            <Button type="submit" busy={formState.isSubmitting}>
              Send invitation
            </Button>
          </form>
        </Card>
      </div>
      <Dialog
        open={removing !== null}
        onClose={() => setRemoving(null)}
        title={`Remove ${removing?.displayName ?? ''} from the crew?`}
        footer={
          <>
            <Button variant="secondary" onClick={() => setRemoving(null)}>
              Keep them
            </Button>
            <Button
              variant="danger"
              busy={remove.isPending}
              onClick={() => removing && remove.mutate(removing.id, { onSettled: () => setRemoving(null) })}
            >
              Remove
            </Button>
          </>
        }
      >
        <p className="text-sm text-slip-700">They lose access to this studio’s calendar at once. You can invite them again later.</p>
      </Dialog>
    </>
  )
}
