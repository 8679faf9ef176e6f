import { uploadsDriver } from '../storage/config'

// Mounted at run time (not in nuxt.config) so one build serves either driver.
export default defineNitroPlugin(() => {
  useStorage().mount('uploads', uploadsDriver())
})
