// Tenant e-mails in Welsh (ICU MessageFormat; Welsh plurals zero/one/two/few/many/other). Written by
// a developer, not a translator: a Welsh speaker should review it before a landlord in Wales relies on
// it. Safety lines carry the same cautions as the English. Typed against the English, so no key is missing.
import type en from "../en-GB/mail.js";

const cy: Record<keyof typeof en, string> = {
  hello: "Helo {name},",
  helloPlain: "Helo,",
  choosePassword: "Dewiswch eich cyfrinair yma:",

  "emergency.namedWithPhone": "ffoniwch linell argyfwng {organisationName} ar unwaith ar {phone}.",
  "emergency.named": "ffoniwch linell argyfwng {organisationName} ar unwaith (mae'r rhif ar eich contract meddiannaeth).",
  "emergency.withPhone": "ffoniwch linell argyfwng eich landlord ar unwaith ar {phone}.",
  "emergency.plain": "ffoniwch linell argyfwng eich landlord ar unwaith (mae'r rhif ar eich contract meddiannaeth).",
  waterNearElectrics: "Os oes dŵr yn dod drwy nenfwd ger goleuadau neu socedi, {emergency}",
  gas: "Os ydych chi'n arogli nwy, agorwch y ffenestri, peidiwch â defnyddio switshis na fflamau, gadewch y cartref a ffoniwch y llinell argyfwng nwy ar 0800 111 999.",
  mouldCaution:
    "Yn y cyfamser: os gwelwch chi lwydni, peidiwch â'i grafu'n sych na'i frwsio, gan fod hynny'n lledaenu sborau. Dylai unrhyw un sydd ag asthma, alergeddau neu system imiwnedd wan, a babanod, gadw draw oddi wrtho, ac os bydd anadlu unrhyw un yn gwaethygu, siaradwch â'ch meddyg teulu neu fferyllydd.",

  "invitation.subject": "Mae {organisationName} yn eich gwahodd i Dewline",
  "invitation.body":
    "Mae {inviterName} o {organisationName} wedi eich gwahodd i Dewline, lle mae adroddiadau am leithder, anwedd a llwydni yn eich cartref yn cael eu cofnodi a'u dilyn.",
  "invitation.expires":
    "Mae'r ddolen yn gweithio unwaith ac yn dod i ben ymhen {hours, plural, other {# awr}}. Os nad oeddech chi'n disgwyl yr e-bost hwn, gallwch ei anwybyddu.",

  "passwordReset.subject": "Ailosod eich cyfrinair Dewline",
  "passwordReset.body": "Gofynnodd rhywun am ailosod cyfrinair eich cyfrif Dewline. I ddewis un newydd, agorwch:",
  "passwordReset.expires":
    "Mae'r ddolen yn gweithio unwaith ac yn dod i ben ymhen {minutes, plural, other {# munud}}. Os na wnaethoch chi ofyn am hyn, anwybyddwch yr e-bost hwn: bydd eich cyfrinair yn aros fel y mae.",

  "signInUnlock.subject": "Mewngofnodi i Dewline",
  "signInUnlock.attempts":
    "Bu sawl ymgais aflwyddiannus i fewngofnodi i'ch cyfrif Dewline, neu gofynnodd rhywun i ni am y ddolen hon. Efallai mai chi oedd yno; efallai fod rhywun wedi bod yn ceisio dyfalu eich cyfrinair. Mae eich cyfrif yn ddiogel ac nid yw wedi'i gloi.",
  "signInUnlock.wait":
    "Tra bo'r ymdrechion yn parhau, mae Dewline yn gofyn am aros ychydig rhwng pob cynnig. I osgoi aros yn eich porwr eich hun, agorwch y ddolen hon yno, yna mewngofnodwch fel arfer:",
  "signInUnlock.expires":
    "Mae'r ddolen yn gweithio unwaith ac yn dod i ben ymhen {minutes, plural, other {# munud}}. Os nad ydych chi'n cofio eich cyfrinair mwyach, defnyddiwch \"Wedi anghofio eich cyfrinair?\" ar y dudalen fewngofnodi.",

  "invitationAddressInUse.subject": "Ceisiodd {organisationName} eich gwahodd i Dewline",
  "invitationAddressInUse.body":
    "Ceisiodd {inviterName} yn {organisationName} wahodd y cyfeiriad e-bost hwn i Dewline. Mae gan y cyfeiriad hwn gyfrif Dewline yn barod, a dim ond i un cyfrif y gall cyfeiriad berthyn, felly does dim wedi newid ac ni agorwyd cyfrif newydd.",
  "invitationAddressInUse.next":
    "Os oeddech chi'n disgwyl y gwahoddiad hwn, dywedwch wrth {organisationName} pa gyfeiriad e-bost arall y gallan nhw eich gwahodd arno. Os nad oeddech chi'n ei ddisgwyl, gallwch anwybyddu'r e-bost hwn.",

  "caseAcknowledgement.subject": "Rydym wedi cael eich adroddiad {reference}",
  "caseAcknowledgement.thanks": "Diolch am ddweud wrthym am leithder neu lwydni yn {address}. Eich cyfeirnod yw {reference}.",
  "caseAcknowledgement.next":
    "Beth sy'n digwydd nesaf: bydd {organisationName} yn edrych ar bob adroddiad, beth bynnag mae unrhyw ddarlleniadau'n ei ddangos. Bydd swyddog yn ei adolygu ac yn cysylltu â chi am archwiliad. Gallwch ddilyn yr achos, ychwanegu lluniau neu ddarlleniadau, a dweud wrthym os yw'n gwaethygu yn:",

  "sensorCaseNotice.subject": "Rydym yn edrych ar leithder yn eich cartref ({reference})",
  "sensorCaseNotice.opened":
    "Mae'r synwyryddion a osododd {organisationName} yn {address} yn dangos amodau lle gall lleithder a llwydni ddechrau, felly rydym wedi agor achos i edrych arno. Does dim rhaid i chi wneud dim i'w ddechrau, a does dim byd yma'n dweud eich bod chi wedi gwneud dim o'i le: mae lleithder fel hyn fel arfer yn dod o'r ffordd y mae cartref wedi'i adeiladu, ei wresogi neu ei awyru, a'n gwaith ni yw dod o hyd i'r achos a'i unioni.",
  "sensorCaseNotice.saw": "Beth welodd y synhwyrydd:",
  "sensorFinding.hours-at-80":
    "{room}: dros y 7 diwrnod diwethaf, roedd wyneb wal neu ffenestr yn ddigon llaith i lwydni ddechrau am tua {hours, plural, other {# awr}}.",
  "sensorFinding.condensing-days": "{room}: roedd dŵr yn cyddwyso ar arwyneb oer ar {days} o'r 7 diwrnod diwethaf.",
  "sensorFinding.other": "{room}: mae'r amodau a fesurwyd dros yr wythnosau diwethaf yn rhai lle gall llwydni ddechrau tyfu.",
  "sensorFinding.aRoom": "Ystafell",
  "sensorCaseNotice.next":
    "Beth sy'n digwydd nesaf: bydd swyddog yn cysylltu â chi i drefnu ymweliad. Eich cyfeirnod yw {reference}. Gallwch ddilyn yr achos, ychwanegu lluniau a dweud wrthym unrhyw beth rydych chi wedi sylwi arno yn:",

  "caseMessage.subject": "Neges am eich adroddiad {reference}",
  "caseMessage.wrote": "Ysgrifennodd {senderName} am eich adroddiad {reference}:",
  "caseMessage.reply": "Gallwch ateb a dilyn yr achos yn:",

  "writtenSummary.subject": "Beth welsom ni a beth sy'n digwydd nesaf: {reference}",
  "writtenSummary.emergency": "Mewn argyfwng, er enghraifft dŵr yn dod drwy nenfwd ger goleuadau neu socedi, {emergency}",
  "writtenSummary.onPage": "Mae'r crynodeb hefyd ar dudalen eich achos:",

  // The day and time come after a colon, so no mutation is needed before them.
  "appointmentProposed.subject.proposed": "Apwyntiad arfaethedig: {work}, {slot} ({reference})",
  "appointmentProposed.subject.rescheduled": "Amser newydd arfaethedig: {work}, {slot} ({reference})",
  "appointmentProposed.subject.operative": "Wedi'i drefnu: {work}, {slot} ({reference})",
  "appointmentProposed.body.proposed":
    "Hoffem ddod i {address} ar gyfer y gwaith hwn: {work}. Yr amser: {slot}. Cadarnhewch ar dudalen eich achos, neu gofynnwch am amser arall os nad yw hwn yn gyfleus:",
  "appointmentProposed.body.rescheduled":
    "Mae'r ymweliad â {address} ar gyfer y gwaith hwn wedi symud: {work}. Yr amser newydd: {slot}. Cadarnhewch ef ar dudalen eich achos, neu gofynnwch am amser arall os nad yw'n gyfleus:",
  "appointmentProposed.body.operative":
    "Rydych wedi'ch trefnu ar gyfer y gwaith hwn yn {address}: {work}. Yr amser: {slot}. Gofynnwyd i'r deiliad contract gadarnhau.",
  "appointmentProposed.accessNotes": "Nodiadau mynediad a'r aelwyd: {notes}",
  "appointment.calendarAttached": "Mae'r apwyntiad wedi'i atodi fel ffeil calendr.",
  "appointmentConfirmed.subject": "Wedi'i gadarnhau: {work}, {slot} ({reference})",
  "appointmentConfirmed.body": "Mae'r apwyntiad yn {address} wedi'i gadarnhau ar gyfer y gwaith hwn: {work}. Yr amser: {slot}.",
  "appointmentCancelled.subject": "Wedi'i ganslo: {work}, {slot} ({reference})",
  "appointmentCancelled.body": "Mae'r ymweliad â {address} wedi'i ganslo. Y gwaith: {work}. Yr amser oedd: {slot}.",
  "appointmentCancelled.reason": "Rheswm: {reason}",
  "appointmentCancelled.calendar": "Mae'r ffeil calendr sydd ynghlwm yn ei dynnu o'ch calendr.",

  "slot.am": "{day, date, day}, yn y bore, 8am tan 12 canol dydd",
  "slot.pm": "{day, date, day}, yn y prynhawn, 12 canol dydd tan 5pm",
  "slot.all-day": "{day, date, day}, drwy'r dydd, 8am tan 5pm",

  "work.extractor-fan": "gosod neu drwsio ffan echdynnu",
  "work.fan-upgrade": "uwchraddio ffan echdynnu (parhaus neu'n synhwyro lleithder)",
  "work.trickle-vents": "gosod neu ddadflocio fentiau diferu (trickle vents)",
  "work.door-undercut": "torri gwaelod drysau i aer lifo",
  "work.piv-unit": "uned awyru mewnbwn positif",
  "work.mould-wash": "golchi llwydni a thriniaeth ffwngladdol",
  "work.mould-resistant-decoration": "ailaddurno gyda phaent sy'n gwrthsefyll llwydni",
  "work.insulation": "inswleiddio neu drwsio pont thermol",
  "work.draught-proofing": "atal drafftiau",
  "work.heating": "trwsio neu uwchraddio'r gwres",
  "work.leak-repair": "trwsio gollyngiad",
  "work.roof-gutter": "trwsio to, cwter neu beipen law",
  "work.damp-proofing": "trwsio cwrs atal lleithder neu rendrad",
  "work.other": "gwaith trwsio",
  "calendar.title": "Ymweliad: {work} ({reference})",
  "calendar.description":
    "Ymweliad ar gyfer {work} (adroddiad {reference}). Gallwch ei gadarnhau neu ofyn am amser arall ar dudalen eich adroddiad yn Dewline.",

  "monitoringStarted.subject": "Gwirio bod y gwaith wedi gweithio: {reference}",
  "monitoringStarted.body":
    "Mae'r gwaith ar eich adroddiad {reference} wedi'i wneud. Am y {days, plural, other {# diwrnod}} nesaf, tan {endsAt, date, date}, byddwn yn gwirio bod y lleithder a'r llwydni wedi dod i ben go iawn.",
  "monitoringStarted.readings":
    "Os oes gennych chi thermomedr a mesurydd lleithder (hygromedr) neu gofnodydd data, ychwanegwch ddarlleniadau ar dudalen eich achos o bryd i'w gilydd, yn yr ystafelloedd a effeithiwyd. Dywedwch wrthym ar unwaith os daw unrhyw beth yn ôl:",

  "fixConfirmed.subject": "Mae'r gwaith wedi gweithio: mae {reference} wedi'i gau",
  "fixConfirmed.body":
    "Rydym wedi gwirio'r gwaith ar eich adroddiad {reference} ac mae'n edrych fel bod y broblem lleithder a llwydni wedi'i datrys, felly rydym wedi cau'r adroddiad.",
  "fixConfirmed.comesBack":
    "Os daw lleithder neu lwydni yn ôl, agorwch dudalen eich achos a dywedwch wrthym ei fod wedi gwaethygu, neu gwnewch adroddiad newydd:",

  "monitoringEnded.subject": "Ychwanegwch ddarlleniadau os gwelwch yn dda: {reference}",
  "monitoringEnded.body":
    "Mae'r cyfnod monitro ar ôl y gwaith ar {reference} wedi dod i ben. Os oes gennych chi ddarlleniadau o'r ychydig wythnosau diwethaf, ychwanegwch nhw nawr er mwyn i ni weld a yw'r lleithder wedi dod i ben, a dywedwch wrthym os yw'r llwydni wedi dod yn ôl:",
};

export default cy;
