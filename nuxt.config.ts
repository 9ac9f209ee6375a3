// Nuxt configuration. Source folders live at the repository root (srcDir '.').
import { fileURLToPath } from 'node:url'

// Node 20.19+ loads these three (under twilio → axios → form-data → get-intrinsic) through their
// "module-sync" export, require.mjs, which Nitro's file tracer does not follow; traced by hand.
const MODULE_SYNC_FILES = ['async-function', 'generator-function', 'async-generator-function']
  .map((name) => fileURLToPath(new URL(`./node_modules/${name}/require.mjs`, import.meta.url)))
export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  srcDir: '.',
  telemetry: false,
  devtools: { enabled: false },
  modules: ['@pinia/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils'],
  css: ['@fontsource/inter/400.css', '@fontsource/inter/500.css', '@fontsource/inter/600.css', '@fontsource/inter/700.css'],
  tailwindcss: {
    cssPath: '~/assets/css/tailwind.css',
    configPath: 'tailwind.config.ts',
    viewer: false,
  },
  app: {
    head: {
      title: 'Cuspline',
      htmlAttrs: { lang: 'en' },
      meta: [{ name: 'viewport', content: 'width=device-width, initial-scale=1' }],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  runtimeConfig: {
    // Every key is overridable by NUXT_* environment variables (see .env.example), and checked once at
    // start-up (server/utils/runtime-config.ts): a wrong value stops the server with the variable's name.
    db: {
      host: '127.0.0.1',
      port: 3307,
      user: 'cuspline',
      password: '',
      database: 'cuspline',
      // A booking waits at most this long for another booking's row lock, then is retried (503 after three tries).
      lockWaitSeconds: 5,
    },
    auth: {
      idleMinutes: 30,
      absoluteHours: 12,
      // Sign-in limits (server/services/auth-service.ts, shared/domain/sign-in-limits.ts), per 15-minute window:
      // one address may fail 10 times on one account and 100 times in all before it gets 429; an account
      // is never locked, but past 3 failures from anywhere each attempt waits 250 ms, doubling, at most 3 s.
      accountAddressFailureLimit: 10,
      ipFailureLimit: 100,
      failureWindowMinutes: 15,
      delayFreeFailures: 3,
      delayBaseMs: 250,
      delayMaxMs: 3000,
      trustProxy: false,
      allowedOrigins: '',
    },
    session: {
      password: '',
      maxAge: 60 * 60 * 12,
      cookie: { sameSite: 'lax', httpOnly: true, secure: true },
    },
    smtp: { host: '127.0.0.1', port: 1025, secure: false, user: '', password: '', from: '' },
    // Patient links (confirm / ask to cancel / .ics): HMAC secret and the address patients open.
    mail: {
      linkSecret: '', publicUrl: 'http://127.0.0.1:3000',
      // Each site's calendar reply address (ORGANIZER); '{site}' is the site's id. '' = the site's own e-mail.
      replyAddress: 'replies+{site}@cuspline.test',
      // Shared secret of the inbound-mail webhook (POST /api/inbound/mail); '' refuses every post.
      inboundSecret: '',
    },
    // The outbox dispatcher loop (server/plugins/outbox-dispatcher.ts).
    outbox: {
      dispatcher: true,
      lane: '',
      pollMs: 2000,
      batchSize: 20,
      leaseSeconds: 120,
      maxAttempts: 8,
      retryBaseSeconds: 30,
      retryMaxSeconds: 3600,
    },
    // Text messages through the hosted SMS service's SDK (twilio). No account SID: texts are not sent
    // (skipped with a reason). fakeUrl sends the SDK's requests to the local fake (scripts/sms-fake.ts);
    // empty with real credentials talks to the real service. webhookBaseUrl: the address the service
    // calls back and signs (default: mail.publicUrl).
    sms: { accountSid: '', authToken: '', from: '', fakeUrl: '', webhookBaseUrl: '', defaultCountry: 'US' },
    // Demo seeding only (server/utils/clock.ts): minutes the booking clock is moved by.
    scheduleClockOffsetMinutes: 0,
  },
  nitro: {
    experimental: { tasks: false },
    externals: { traceInclude: MODULE_SYNC_FILES },
  },
  typescript: { strict: true },
})
