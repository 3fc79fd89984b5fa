/** special-access-component: components bound by the permissions that give an app special access. */
import type { Check } from "../types.js";

/**
 * Binding permissions of services (and the device-admin receiver) through which the user grants an app
 * special access in settings, or picks it for a role. Names checked against the platform table (API 34,
 * test/score/checks/special-access-component.test.ts); what each grants, from memory of the developer
 * documentation of each service class (AccessibilityService, NotificationListenerService, DeviceAdminReceiver,
 * VpnService, InputMethodService, AutofillService, VoiceInteractionService, CredentialProviderService,
 * ConditionProviderService, InCallService, CallScreeningService, CallRedirectionService, QuickAccessWalletService).
 * Carrier services are left out: only an app signed with the SIM carrier's certificate is bound, never one
 * a user grants special access to.
 */
export const SPECIAL_ACCESS: Record<string, string> = {
  "android.permission.BIND_ACCESSIBILITY_SERVICE": "an accessibility service: reads the screen and acts on the user's behalf",
  "android.permission.BIND_NOTIFICATION_LISTENER_SERVICE": "a notification listener: reads every notification",
  "android.permission.BIND_DEVICE_ADMIN": "a device administrator: can lock or wipe the device and enforce policies",
  "android.permission.BIND_VPN_SERVICE": "a VPN service: sees and routes the device's network traffic",
  "android.permission.BIND_INPUT_METHOD": "an input method: sees everything the user types",
  "android.permission.BIND_AUTOFILL_SERVICE": "an autofill service: reads and fills form fields, passwords included",
  "android.permission.BIND_INCALL_SERVICE": "an in-call service: manages phone calls",
  "android.permission.BIND_SCREENING_SERVICE": "a call screening service: sees and can block incoming calls",
  "android.permission.BIND_CALL_REDIRECTION_SERVICE": "a call redirection service: can reroute outgoing calls",
  "android.permission.BIND_VOICE_INTERACTION": "a voice assistant: hears the user, sees the screen on request and acts across apps",
  "android.permission.BIND_CREDENTIAL_PROVIDER_SERVICE": "a credential provider: stores and fills the user's passwords and passkeys",
  "android.permission.BIND_CONDITION_PROVIDER_SERVICE": "a Do-Not-Disturb condition provider: switches Do Not Disturb on and off",
  "android.permission.BIND_QUICK_ACCESS_WALLET_SERVICE": "a wallet service: shows payment cards on the lock screen",
};

export const specialAccessComponent: Check = {
  meta: {
    id: "special-access-component",
    title: "Component that claims special access",
    description: "The app declares a component bound by a permission through which the user grants special access (accessibility, notification listener, device admin, VPN, input method and similar).",
    docs: "docs/checks/special-access-component.md",
    defaultLevel: "warning",
    tags: ["special-access"],
  },
  run(ctx) {
    return ctx.manifest.components
      .filter((c) => c.permission !== undefined && SPECIAL_ACCESS[c.permission] !== undefined)
      .map((c) => ({ subject: c.name, location: c.source, data: { kind: c.kind, permission: c.permission, grants: SPECIAL_ACCESS[c.permission!] } }));
  },
};
