// Tenant e-mails in English (ICU MessageFormat). Every key here must exist in each other language
// (server/locales/<lng>/mail.ts is typed against this file). Plain words, no staff-only terms.
export default {
  hello: "Hello {name},",
  helloPlain: "Hello,",
  choosePassword: "Choose your password here:",

  // The landlord's emergency line, with its number when the landlord has set one in its policy.
  "emergency.namedWithPhone": "call the {organisationName} emergency line straight away on {phone}.",
  "emergency.named": "call the {organisationName} emergency line straight away (the number is on your tenancy agreement).",
  "emergency.withPhone": "call your landlord's emergency line straight away on {phone}.",
  "emergency.plain": "call your landlord's emergency line straight away (the number is on your tenancy agreement).",
  waterNearElectrics: "If water is coming through a ceiling near lights or sockets, {emergency}",
  // The national gas emergency line for Great Britain (from memory), not the landlord's.
  gas: "If you smell gas, open the windows, do not use switches or flames, leave the home and call the gas emergency line on 0800 111 999.",
  mouldCaution:
    "Until then: if you see mould, do not scrape it dry or brush it, as that spreads spores. Anyone with asthma, allergies or a weak immune system, and babies, should keep away from it, and if anyone's breathing gets worse, speak to your GP or pharmacist.",

  "invitation.subject": "You are invited to Dewline by {organisationName}",
  "invitation.body":
    "{inviterName} of {organisationName} has invited you to Dewline, where reports of damp, condensation and mould in your home are recorded and followed up.",
  "invitation.expires":
    "The link works once and expires in {hours, plural, one {# hour} other {# hours}}. If you were not expecting this e-mail you can ignore it.",

  "passwordReset.subject": "Reset your Dewline password",
  "passwordReset.body": "Someone asked to reset the password of your Dewline account. To choose a new one, open:",
  "passwordReset.expires":
    "The link works once and expires in {minutes, plural, one {# minute} other {# minutes}}. If you did not ask for this, ignore this e-mail: your password stays as it is.",

  "signInUnlock.subject": "Signing in to Dewline",
  "signInUnlock.attempts":
    "There have been several unsuccessful attempts to sign in to your Dewline account, or someone asked us for this link. It may have been you; someone may have been trying to guess your password. Your account is safe and has not been locked.",
  "signInUnlock.wait":
    "While the attempts go on, Dewline asks for a short wait between tries. To skip the wait in your own browser, open this link there, then sign in as usual:",
  "signInUnlock.expires":
    'The link works once and expires in {minutes, plural, one {# minute} other {# minutes}}. If you do not know your password any more, use "Forgot your password?" on the sign-in page.',

  "invitationAddressInUse.subject": "{organisationName} tried to invite you to Dewline",
  "invitationAddressInUse.body":
    "{inviterName} at {organisationName} tried to invite this e-mail address to Dewline. This address already has a Dewline account, and one address can only belong to one account, so nothing has been changed and no new account was opened.",
  "invitationAddressInUse.next":
    "If you expected this invitation, please tell {organisationName} which other e-mail address they can invite you at. If you did not expect it, you can ignore this e-mail.",

  "caseAcknowledgement.subject": "We have your report {reference}",
  "caseAcknowledgement.thanks": "Thank you for telling us about damp or mould at {address}. Your reference is {reference}.",
  "caseAcknowledgement.next":
    "What happens next: {organisationName} will look into every report, whatever any readings show. An officer will review it and contact you about an inspection. You can follow the case, add photos or readings, and tell us if it gets worse at:",

  "sensorCaseNotice.subject": "We are looking into damp at your home ({reference})",
  "sensorCaseNotice.opened":
    "The sensors {organisationName} fitted at {address} show conditions in which damp and mould can start, so we have opened a case to look into it. You do not need to do anything to start it, and nothing here says you have done anything wrong: damp like this usually comes from how a home is built, heated or ventilated, and it is ours to find the cause and put it right.",
  "sensorCaseNotice.saw": "What the sensor saw:",
  "sensorFinding.hours-at-80":
    "{room}: over the last 7 days, a wall or window surface was damp enough for mould to start for about {hours, plural, one {# hour} other {# hours}}.",
  "sensorFinding.condensing-days": "{room}: water was condensing on a cold surface on {days} of the last 7 days.",
  "sensorFinding.other": "{room}: the conditions measured over recent weeks are ones in which mould can begin to grow.",
  "sensorFinding.aRoom": "A room",
  "sensorCaseNotice.next":
    "What happens next: an officer will contact you to arrange a visit. Your reference is {reference}. You can follow the case, add photos and tell us anything you have noticed at:",

  "caseMessage.subject": "A message about your report {reference}",
  "caseMessage.wrote": "{senderName} wrote about your report {reference}:",
  "caseMessage.reply": "You can reply and follow the case at:",

  "writtenSummary.subject": "What we found and what happens next: {reference}",
  "writtenSummary.emergency": "In an emergency, such as water coming through a ceiling near lights or sockets, {emergency}",
  "writtenSummary.onPage": "The summary is also on your case page:",

  // An appointment: {work} is one of the work words below, {slot} one of the slot lines.
  "appointmentProposed.subject.proposed": "Proposed appointment: {work}, {slot} ({reference})",
  "appointmentProposed.subject.rescheduled": "New time proposed: {work}, {slot} ({reference})",
  "appointmentProposed.subject.operative": "Booked: {work}, {slot} ({reference})",
  "appointmentProposed.body.proposed":
    "We would like to come to {address} for {work} on {slot}. Please confirm on your case page, or ask for another time if this one does not suit you:",
  "appointmentProposed.body.rescheduled":
    "The visit to {address} for {work} has moved. The new time is {slot}. Please confirm it on your case page, or ask for another time if it does not suit you:",
  "appointmentProposed.body.operative": "You are booked for {work} at {address}, {slot}. The tenant has been asked to confirm.",
  "appointmentProposed.accessNotes": "Access and household notes: {notes}",
  "appointment.calendarAttached": "The appointment is attached as a calendar file.",
  "appointmentConfirmed.subject": "Confirmed: {work}, {slot} ({reference})",
  "appointmentConfirmed.body": "The appointment for {work} at {address} is confirmed for {slot}.",
  "appointmentCancelled.subject": "Cancelled: {work}, {slot} ({reference})",
  "appointmentCancelled.body": "The visit for {work} at {address} on {slot} is cancelled.",
  "appointmentCancelled.reason": "Reason: {reason}",
  "appointmentCancelled.calendar": "The attached calendar file removes it from your calendar.",

  "slot.am": "{day, date, day}, morning, 8am to 12 noon",
  "slot.pm": "{day, date, day}, afternoon, 12 noon to 5pm",
  "slot.all-day": "{day, date, day}, all day, 8am to 5pm",

  "work.extractor-fan": "extractor fan fitting or repair",
  "work.fan-upgrade": "extractor fan upgrade (continuous or humidity-controlled)",
  "work.trickle-vents": "trickle vents fitted or unblocked",
  "work.door-undercut": "doors undercut for air to flow",
  "work.piv-unit": "positive input ventilation unit",
  "work.mould-wash": "mould wash and fungicidal treatment",
  "work.mould-resistant-decoration": "redecoration with mould-resistant paint",
  "work.insulation": "insulation or thermal-bridge repair",
  "work.draught-proofing": "draught-proofing",
  "work.heating": "heating repair or upgrade",
  "work.leak-repair": "leak repair",
  "work.roof-gutter": "roof, gutter or downpipe repair",
  "work.damp-proofing": "damp-proof course or render repair",
  "work.other": "repair work",
  "calendar.title": "Visit: {work} ({reference})",
  "calendar.description":
    "A visit for {work} (report {reference}). You can confirm it or ask for another time on your report's page in Dewline.",

  "monitoringStarted.subject": "Checking the repair worked: {reference}",
  "monitoringStarted.body":
    "The work on your report {reference} is done. Over the next {days, plural, one {# day} other {# days}}, until {endsAt, date, day}, we will check that the damp and mould have really stopped.",
  "monitoringStarted.readings":
    "If you have a thermometer and humidity meter (hygrometer) or a data logger, please add readings on your case page now and then, in the rooms that were affected. Tell us at once if anything comes back:",

  "fixConfirmed.subject": "The repair worked: {reference} is closed",
  "fixConfirmed.body":
    "We have checked the work on your report {reference} and the damp and mould problem looks fixed, so we have closed the report.",
  "fixConfirmed.comesBack":
    "If damp or mould comes back, open your case page and tell us it has got worse, or make a new report:",

  "monitoringEnded.subject": "Please add readings: {reference}",
  "monitoringEnded.body":
    "The monitoring period after the work on {reference} has ended. If you have readings from the last few weeks, please add them now so we can see whether the damp has stopped, and tell us if the mould has come back:",
} as const;
