import { defineStore } from 'pinia'
import { listDevMail } from '../api/dev-mail'
import { useLoadedList } from '../composables/useLoadedList'

/** The local SMTP fake's messages, for the developer mail page. */
export const useDevMailStore = defineStore('devMail', () => {
  const { items, isLoading, error, load } = useLoadedList(() => listDevMail())
  return { items, isLoading, error, load }
})
