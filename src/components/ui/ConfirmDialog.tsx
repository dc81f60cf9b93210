import type { ReactNode } from 'react'
import { Alert } from './Alert'
import { Button } from './Button'
import { Dialog } from './Dialog'

interface ConfirmDialogProps {
  open: boolean
  onClose: () => void
  title: ReactNode
  /** What will happen, in plain words: the reader decides on this. */
  children: ReactNode
  confirmLabel: string
  onConfirm: () => void
  busy?: boolean
  tone?: 'primary' | 'danger'
  /** The server's refusal, if the attempt failed. */
  problem?: string | null
}

/** Asks before a click that changes things for other people, saying what it will do. */
export function ConfirmDialog({
  open,
  onClose,
  title,
  children,
  confirmLabel,
  onConfirm,
  busy,
  tone = 'primary',
  problem,
}: ConfirmDialogProps) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={title}
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Go back
          </Button>
          <Button variant={tone === 'danger' ? 'danger' : 'primary'} busy={busy} onClick={onConfirm}>
            {confirmLabel}
          </Button>
        </>
      }
    >
      <div className="space-y-3 text-sm text-slip-800">
        {children}
        {problem && <Alert tone="danger">{problem}</Alert>}
      </div>
    </Dialog>
  )
}
