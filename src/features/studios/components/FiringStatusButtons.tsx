import { useEffect, useState, type ReactNode } from 'react'
import { FIRING_STATUS_LABELS, type FiringStatus } from '../../../../shared/workflow/firing-status'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { ConfirmDialog } from '../../../components/ui/ConfirmDialog'
import { ApiError } from '../../../lib/api'
import { useMoveFiring, useUndoFiringMove } from '../api/firings'
import type { FiringRecord } from '../api/types'

type Move = Exclude<FiringStatus, 'cancelled'>

/** What the studio does to move a firing on, in its words. */
export const STATUS_ACTIONS: Record<Move, string> = {
  open: 'Take ware again',
  full: 'Mark full',
  closed: 'Stop taking ware',
  loading: 'Start loading',
  firing: 'Kiln is firing',
  cooling: 'Kiln is cooling',
  unloaded: 'Kiln unloaded',
}

interface FiringStatusButtonsProps {
  firing: FiringRecord
  /** Drawn after the moves, e.g. the cancel button of the calendar's dialog. */
  children?: ReactNode
}

/** Re-renders when the undo window closes, so the undo button goes away on time. */
function useStillBefore(iso: string | null): boolean {
  const [, tick] = useState(0)
  const until = iso ? Date.parse(iso) : 0
  useEffect(() => {
    if (!iso) return
    const timer = setTimeout(() => tick((n) => n + 1), Math.max(0, until - Date.now()) + 50)
    return () => clearTimeout(timer)
  }, [iso, until])
  return iso !== null && Date.now() < until
}

/**
 * The stage moves the firing allows now. The server asks before a move that starts ahead of the
 * posted date or makes waiting requests lapse (the question names the date and what lapses); the
 * last move can be undone for ten minutes.
 */
export function FiringStatusButtons({ firing, children }: FiringStatusButtonsProps) {
  const move = useMoveFiring(firing.studioId)
  const undo = useUndoFiringMove(firing.studioId)
  const [question, setQuestion] = useState<{ status: Move; text: string } | null>(null)
  const moves = firing.nextStatuses.filter((s): s is Move => s !== 'cancelled')
  const canUndo = useStillBefore(firing.undo?.until ?? null)
  const go = (status: Move, confirm = false) =>
    move.mutate(
      { firingId: firing.id, status, confirm },
      {
        onSuccess: () => setQuestion(null),
        onError: (error) => {
          if (error instanceof ApiError && error.code === 'needs-confirmation') setQuestion({ status, text: error.message })
        },
      },
    )
  const problem = move.error && !(move.error instanceof ApiError && move.error.code === 'needs-confirmation') ? move.error.message : null
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-2" role="group" aria-label="Move the firing on">
        {moves.map((status) => (
          <Button
            key={status}
            variant={status === 'loading' || status === 'firing' || status === 'cooling' || status === 'unloaded' ? 'primary' : 'secondary'}
            size="sm"
            busy={move.isPending && move.variables?.status === status}
            disabled={move.isPending || undo.isPending}
            onClick={() => go(status)}
          >
            {STATUS_ACTIONS[status]}
          </Button>
        ))}
        {children}
      </div>
      {canUndo && firing.undo && (
        <div
          className="flex flex-wrap items-center gap-2 rounded-control border border-slip-200 bg-slip-50 px-3 py-2 text-sm"
          data-testid="undo-move"
        >
          <span>
            Moved to <strong>{FIRING_STATUS_LABELS[firing.status].toLowerCase()}</strong>. You can undo this until{' '}
            {new Date(firing.undo.until).toLocaleTimeString([], { hour: 'numeric', minute: '2-digit' })}.
          </span>
          <Button size="sm" variant="secondary" busy={undo.isPending} onClick={() => undo.mutate(firing.id)}>
            Undo: back to {FIRING_STATUS_LABELS[firing.undo.from].toLowerCase()}
          </Button>
        </div>
      )}
      <ConfirmDialog
        open={question !== null}
        onClose={() => setQuestion(null)}
        title={question ? `${STATUS_ACTIONS[question.status]}?` : ''}
        confirmLabel={question ? `${STATUS_ACTIONS[question.status]}: go ahead` : ''}
        busy={move.isPending}
        onConfirm={() => question && go(question.status, true)}
      >
        <p data-testid="stage-question">{question?.text}</p>
        <p className="text-xs text-slip-600">You can undo the move for ten minutes; mail to potters waits until then.</p>
      </ConfirmDialog>
      {(problem || undo.isError) && <Alert tone="danger">{problem ?? undo.error?.message}</Alert>}
    </div>
  )
}
