// Tests start the built app the same way the scripts do.
export { freePort, startAppServer, type RunningServer } from '../../scripts/lib/app-server'
