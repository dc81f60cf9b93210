import type { ReactNode } from 'react'

export function Card({
  children,
  className = '',
  as: Tag = 'section',
}: {
  children: ReactNode
  className?: string
  as?: 'section' | 'div' | 'article' | 'li'
}) {
  return <Tag className={`rounded-card border border-slip-200 bg-white p-5 shadow-card ${className}`}>{children}</Tag>
}

export function PageHeader({ title, lead, actions }: { title: ReactNode; lead?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 className="text-2xl font-bold tracking-tight text-slip-900 sm:text-3xl">{title}</h1>
        {lead && <p className="mt-1 max-w-2xl text-slip-600">{lead}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </header>
  )
}

export function EmptyState({ title, children, action }: { title: ReactNode; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-card border border-dashed border-slip-300 bg-slip-50 px-6 py-10 text-center">
      <p className="font-semibold text-slip-800">{title}</p>
      {children && <div className="mx-auto mt-1 max-w-md text-sm text-slip-600">{children}</div>}
      {action && <div className="mt-4">{action}</div>}
    </div>
  )
}
