// The server's error messages a tenant can meet, in English (ICU MessageFormat). Each text is exactly the
// English the server has always sent: English answers are never rendered from here (the thrower's own text
// goes out), so these are the keys the Welsh is found by. A message without {placeholders} is found by its
// English text; one with values is named by id where it is thrown (AppError.saying). See DEVELOPERS.md,
// "Error messages in the tenant's language"; tests/server/error-language.test.ts checks every text here
// still occurs in the server's code.
export default {
  // Signing in, sessions and the request itself (middleware).
  "sign-in-first": "Please sign in to continue.",
  "not-allowed": "You are not allowed to do that.",
  "not-found": "Not found.",
  "role-not-allowed": "Your account is not allowed to use this part of Dewline.",
  "csrf-invalid": "The security token of this request is missing or out of date. Reload the page and try again.",
  "invalid-json": "The request body is not valid JSON.",
  "body-too-large": "The request body is too large.",
  "body-encoding": "The request body's encoding is not supported; send UTF-8 JSON.",
  internal: "Something went wrong on our side. Please try again; if it keeps happening, tell your landlord's support team.",
  "database-unavailable": "The service is briefly unavailable: our database is not answering. Please try again in a few seconds.",
  "database-busy": "The service is busy right now. Please try again in a moment.",
  "already-applied":
    "This was already saved by an earlier attempt with the same Idempotency-Key, but its answer was not kept. Refresh to see the result; do not send it again.",
  "try-again-in": "Try again in {minutes, plural, one {# minute} other {# minutes}}.",

  // Sign-in, forgotten password, unlock link and invitation (signed out).
  "sign-in-failed": "That e-mail address and password do not match an active account.",
  "sign-in-wait-seconds":
    "There have been several unsuccessful attempts to sign in to this account, so we ask for a short wait between tries. Please wait {seconds} seconds and try again. If this is your account, we have e-mailed you a link that lets you sign in straight away.",
  "sign-in-wait-minutes":
    "There have been several unsuccessful attempts to sign in to this account, so we ask for a short wait between tries. Please wait {minutes} minutes and try again. If this is your account, we have e-mailed you a link that lets you sign in straight away.",
  "sign-in-limit": "There have been many unsuccessful sign-ins from your network.",
  "sign-in-limit-hint":
    'If you need to sign in sooner, choose "E-mail me a link to skip the wait" and open the link in this browser.',
  "reset-limit": "Too many password reset requests.",
  "unlock-limit": "Too many requests for a sign-in link.",
  "link-not-valid-any-more": "This link is not valid any more: it may have been used already or have expired. Ask for a new one.",
  "email-missing": "Enter an e-mail address.",
  "email-too-long": "An e-mail address can be at most 190 characters.",
  "email-invalid": "Enter a valid e-mail address, like name@example.org.",
  "new-password-missing": "Enter a password.",
  "new-password-too-short": "Use at least 10 characters.",
  "new-password-too-long": "Use at most 200 characters.",
  "password-missing": "Enter your password.",
  "link-token-missing": "The link is missing its token.",
  "link-not-valid": "This link is not valid.",

  // My home, my reports, the report form and advice.
  "no-tenancy": "We could not find a current tenancy for your account. Please contact your landlord.",
  "no-such-home": "No such home.",
  "no-such-case": "No such case.",
  "report-description": "Tell us in a few words what you see.",
  "report-description-too-long": "Please keep the description under 4,000 characters.",
  "report-locations": "Choose at least one place.",
  "report-observations": "Choose at least one thing you have noticed.",
  "report-rooms": "roomIds: choose rooms of this home.",
  "worse-note": "Tell us briefly what has changed.",
  "no-advice": "There is no advice for a report that is finished or withdrawn.",
  "language-choice": 'Choose "en" (English) or "cy" (Cymraeg).',
  "language-staff": "Only tenants choose a language: staff screens are in English.",

  // Photos.
  "photo-too-large": "A file is too large: each photo can be at most 15 MB.",
  "photos-too-many": "Send at most 10 photos at a time.",
  "upload-unreadable": "The upload could not be read. Please try again.",
  "photo-heic":
    "This photo is in HEIC format, which we cannot read yet. On an iPhone, choose Settings › Camera › Formats › Most Compatible, or share the photo as JPEG, then try again.",
  "photo-wrong-type": "This file is not a photo we can read. Please send JPEG, PNG, WebP or AVIF images.",
  "photo-damaged": "This photo could not be read: it may be damaged or only partly uploaded. Please try again.",
  "photo-too-many-pixels": "This image has too many pixels to process. Please send a smaller photo.",
  "photos-none-chosen": "photos: choose at least one photo.",
  "photos-none-chosen-field": "Choose at least one photo.",
  "photos-too-many-pixels":
    "These photos together have too many pixels to process at once (at most {most} megapixels in one upload). Please send fewer at a time.",
  "photos-hourly-limit":
    "You have reached the photo upload limit for one hour. Please try again in {minutes, plural, one {a minute} other {about # minutes}}.",
  "photos-busy": "Many photos are being processed just now. Please try again in a moment.",
  "no-such-photo": "No such photo.",
  "photo-file-missing": "This photo's file is missing. Please tell your landlord's support team.",
  "photos-unavailable": "Photos cannot be shown just now. Please try again in a few minutes.",

  // Messages with the landlord.
  "message-missing": "Write the message.",
  "message-too-long": "Keep the message to 5,000 characters or fewer.",
  "message-internal": "Only staff can write internal notes. Your message goes to your landlord.",
  "message-photos": "photoIds: attach photos of this report.",

  // Complaints.
  "complaint-missing": "Write the complaint.",
  "complaint-too-long": "Keep the complaint to 5,000 characters or fewer.",
  "escalation-missing": "Write why you are still unhappy.",
  "escalation-too-long": "Keep why you are still unhappy to 5,000 characters or fewer.",
  "no-such-complaint": "No such complaint.",
  "complaint-already-open": "This case already has an open complaint: add to it, or raise a new one once it is closed.",
  "complaint-changed": "This complaint has changed since you opened it: reload it and try again.",
  "complaint-closed": "This complaint is closed: raise a new one if something is still wrong.",
  "complaint-not-yet-stage-2": "A complaint goes to stage 2 once the stage 1 response has been sent.",

  // Appointments.
  "no-such-work-order": "No such work order.",
  "no-appointment-waiting": "There is no appointment waiting for your answer on this work.",
  "another-time-asked": "You have asked for another time; your landlord will offer a new slot.",
  "another-time-reason": "Tell us which days or times suit you better.",
} as const;
