// The notice list as the API answers it (server/services/notices.ts) and the header reads it.

export interface NoticeJson {
  id: string
  /** What happened, as a stable code: `price-raised`, `lapsed`, `balance-paid`, … */
  kind: string
  title: string
  body: string
  /** Where in the app it leads. */
  path: string
  read: boolean
  at: string
}

export interface NoticeList {
  items: NoticeJson[]
  unread: number
}
