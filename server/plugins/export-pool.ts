/**
 * Starts the export workers with the server (see ExportPool.warm): a worker
 * loading its bundle at the first costly request held up other members'
 * answers for a second or more on a busy machine.
 */
export default defineNitroPlugin(() => {
  exportRunner().options.pool?.warm()
})
