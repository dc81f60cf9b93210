import type { ReactNode } from 'react'
import { Card } from '../../../components/ui/Card'

export function AuthCard({ title, lead, children, footer }: { title: string; lead?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="mx-auto w-full max-w-md py-6">
      <Card className="p-6 sm:p-8">
        <h1 className="text-2xl font-bold tracking-tight">{title}</h1>
        {lead && <p className="mt-1 text-sm text-slip-600">{lead}</p>}
        <div className="mt-6">{children}</div>
      </Card>
      {footer && <div className="mt-4 text-center text-sm text-slip-600">{footer}</div>}
    </div>
  )
}
