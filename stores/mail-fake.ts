/**
 * Whether this install uses the local mail fake (SHEAF_MAIL_FAKE=1 at run time), read on the
 * server during the first render and carried to the browser in the payload.
 */
export const useMailFake = () =>
  useState<boolean>('mail-fake', () => (import.meta.server ? process.env.SHEAF_MAIL_FAKE === '1' : false))
