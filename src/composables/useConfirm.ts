import { useQuasar } from 'quasar'

export interface ConfirmOptions {
  title: string
  message: string
  confirmLabel: string
  /** Destructive actions get the warning colour so a hurried click is less likely. */
  destructive?: boolean
}

/** A yes/no question as a promise; dismissing the dialog counts as "no". */
export function useConfirm() {
  const $q = useQuasar()

  return function confirm(options: ConfirmOptions): Promise<boolean> {
    return new Promise((resolve) => {
      $q.dialog({
        title: options.title,
        message: options.message,
        persistent: false,
        focus: 'cancel',
        ok: {
          label: options.confirmLabel,
          color: options.destructive ? 'negative' : 'primary',
          unelevated: true,
          noCaps: true,
          'data-testid': 'confirm-ok',
        },
        cancel: { label: 'Cancel', flat: true, noCaps: true, color: 'dark', 'data-testid': 'confirm-cancel' },
      })
        .onOk(() => resolve(true))
        .onCancel(() => resolve(false))
        .onDismiss(() => resolve(false))
    })
  }
}
