// When a start or test script launched this process, stop with it, so that a killed script
// never leaves a server behind on its port.
export default defineNitroPlugin(() => {
  const parent = Number(process.env.UNSCATHED_PARENT_PID)
  if (!Number.isInteger(parent) || parent <= 0) return
  setInterval(() => {
    try {
      process.kill(parent, 0)
    }
    catch {
      process.exit(0)
    }
  }, 2000).unref()
})
