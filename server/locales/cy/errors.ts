// The server's error messages a tenant can meet, in Welsh (plain words, for a reading age of about 9).
// Apostrophes are the curly ’ so ICU MessageFormat never reads one as a quote. A Welsh speaker should
// review the wording before a landlord in Wales relies on it.
import type en from "../en-GB/errors.js";

const cy: Record<keyof typeof en, string> = {
  "sign-in-first": "Mewngofnodwch i barhau.",
  "not-allowed": "Ni chewch wneud hynny.",
  "not-found": "Heb ei ganfod.",
  "role-not-allowed": "Ni all eich cyfrif ddefnyddio’r rhan hon o Dewline.",
  "csrf-invalid": "Mae’r dudalen hon wedi bod ar agor yn rhy hir. Ail-lwythwch y dudalen a rhowch gynnig arall arni.",
  "invalid-json": "Nid oedd modd darllen yr hyn a anfonwyd. Ail-lwythwch y dudalen a rhowch gynnig arall arni.",
  "body-too-large": "Mae’r hyn a anfonwyd yn rhy fawr.",
  "body-encoding": "Nid oedd modd darllen yr hyn a anfonwyd. Ail-lwythwch y dudalen a rhowch gynnig arall arni.",
  internal:
    "Aeth rhywbeth o’i le ar ein hochr ni. Rhowch gynnig arall arni. Os yw’n dal i ddigwydd, dywedwch wrth dîm cymorth eich landlord.",
  "database-unavailable": "Nid yw’r gwasanaeth ar gael am ennyd. Rhowch gynnig arall arni mewn ychydig eiliadau.",
  "database-busy": "Mae’r gwasanaeth yn brysur ar hyn o bryd. Rhowch gynnig arall arni mewn munud.",
  "already-applied": "Cafodd hyn ei gadw’n barod y tro cyntaf. Ail-lwythwch y dudalen i’w weld. Peidiwch â’i anfon eto.",
  "try-again-in":
    "Rhowch gynnig arall arni ymhen {minutes, plural, zero {# munud} one {# munud} two {# funud} few {# munud} many {# munud} other {# munud}}.",

  "sign-in-failed": "Nid yw’r cyfeiriad e-bost a’r cyfrinair yn cyfateb i gyfrif gweithredol.",
  "sign-in-wait-seconds":
    "Cafwyd sawl ymgais aflwyddiannus i fewngofnodi i’r cyfrif hwn, felly gofynnwn i chi aros ychydig rhwng pob cynnig. Arhoswch {seconds} eiliad a rhowch gynnig arall arni. Os mai eich cyfrif chi yw hwn, rydym wedi anfon dolen atoch drwy e-bost fel y gallwch fewngofnodi ar unwaith.",
  "sign-in-wait-minutes":
    "Cafwyd sawl ymgais aflwyddiannus i fewngofnodi i’r cyfrif hwn, felly gofynnwn i chi aros ychydig rhwng pob cynnig. Arhoswch {minutes} munud a rhowch gynnig arall arni. Os mai eich cyfrif chi yw hwn, rydym wedi anfon dolen atoch drwy e-bost fel y gallwch fewngofnodi ar unwaith.",
  "sign-in-limit": "Cafwyd llawer o ymdrechion aflwyddiannus i fewngofnodi o’ch rhwydwaith.",
  "sign-in-limit-hint":
    "Os oes angen i chi fewngofnodi’n gynt, dewiswch “Anfonwch ddolen ataf i osgoi aros” ac agorwch y ddolen yn y porwr hwn.",
  "reset-limit": "Gormod o geisiadau i ailosod cyfrinair.",
  "unlock-limit": "Gormod o geisiadau am ddolen mewngofnodi.",
  "link-not-valid-any-more":
    "Nid yw’r ddolen hon yn gweithio mwyach: efallai ei bod wedi cael ei defnyddio’n barod neu wedi dod i ben. Gofynnwch am un newydd.",
  "email-missing": "Rhowch gyfeiriad e-bost.",
  "email-too-long": "Gall cyfeiriad e-bost fod yn 190 nod ar y mwyaf.",
  "email-invalid": "Rhowch gyfeiriad e-bost dilys, fel enw@example.org.",
  "new-password-missing": "Rhowch gyfrinair.",
  "new-password-too-short": "Defnyddiwch o leiaf 10 nod.",
  "new-password-too-long": "Defnyddiwch 200 nod ar y mwyaf.",
  "password-missing": "Rhowch eich cyfrinair.",
  "link-token-missing": "Mae rhan o’r ddolen ar goll. Agorwch y ddolen o’r e-bost eto.",
  "link-not-valid": "Nid yw’r ddolen hon yn ddilys.",

  "no-tenancy": "Ni allem ddod o hyd i gontract meddiannaeth cyfredol ar gyfer eich cyfrif. Cysylltwch â’ch landlord.",
  "no-such-home": "Nid yw’r cartref hwn yn bodoli.",
  "no-such-case": "Nid yw’r adroddiad hwn yn bodoli.",
  "report-description": "Dywedwch wrthym mewn ychydig eiriau beth rydych chi’n ei weld.",
  "report-description-too-long": "Cadwch y disgrifiad o dan 4,000 nod.",
  "report-locations": "Dewiswch o leiaf un lle.",
  "report-observations": "Dewiswch o leiaf un peth rydych chi wedi sylwi arno.",
  "report-rooms": "roomIds: dewiswch ystafelloedd yn y cartref hwn.",
  "worse-note": "Dywedwch wrthym yn fyr beth sydd wedi newid.",
  "no-advice": "Nid oes cyngor ar gyfer adroddiad sydd wedi gorffen neu wedi’i dynnu’n ôl.",
  "language-choice": "Dewiswch “en” (English) neu “cy” (Cymraeg).",
  "language-staff": "Dim ond deiliaid contract sy’n dewis iaith: mae sgriniau’r staff yn Saesneg.",

  "photo-too-large": "Mae ffeil yn rhy fawr: gall pob llun fod yn 15 MB ar y mwyaf.",
  "photos-too-many": "Anfonwch 10 llun ar y mwyaf ar y tro.",
  "upload-unreadable": "Nid oedd modd darllen yr hyn a lwythwyd. Rhowch gynnig arall arni.",
  "photo-heic":
    "Mae’r llun hwn ar ffurf HEIC, ac ni allwn ei ddarllen eto. Ar iPhone, dewiswch Settings › Camera › Formats › Most Compatible, neu rhannwch y llun fel JPEG, yna rhowch gynnig arall arni.",
  "photo-wrong-type": "Nid yw’r ffeil hon yn llun y gallwn ei ddarllen. Anfonwch luniau JPEG, PNG, WebP neu AVIF.",
  "photo-damaged":
    "Nid oedd modd darllen y llun hwn: efallai ei fod wedi’i ddifrodi neu heb lwytho’n llawn. Rhowch gynnig arall arni.",
  "photo-too-many-pixels": "Mae gormod o bicseli yn y llun hwn. Anfonwch lun llai.",
  "photos-none-chosen": "photos: dewiswch o leiaf un llun.",
  "photos-none-chosen-field": "Dewiswch o leiaf un llun.",
  "photos-too-many-pixels":
    "Mae gormod o bicseli yn y lluniau hyn gyda’i gilydd (dim mwy na {most} megapicsel mewn un llwyth). Anfonwch lai ar y tro.",
  "photos-hourly-limit":
    "Rydych wedi cyrraedd y nifer mwyaf o luniau am un awr. Rhowch gynnig arall arni {minutes, plural, one {ymhen munud} other {ymhen tua # munud}}.",
  "photos-busy": "Mae llawer o luniau’n cael eu prosesu ar hyn o bryd. Rhowch gynnig arall arni mewn munud.",
  "no-such-photo": "Nid yw’r llun hwn yn bodoli.",
  "photo-file-missing": "Mae ffeil y llun hwn ar goll. Dywedwch wrth dîm cymorth eich landlord.",
  "photos-unavailable": "Nid oes modd dangos lluniau ar hyn o bryd. Rhowch gynnig arall arni mewn ychydig funudau.",

  "message-missing": "Ysgrifennwch y neges.",
  "message-too-long": "Cadwch y neges i 5,000 nod neu lai.",
  "message-internal": "Dim ond staff sy’n gallu ysgrifennu nodiadau mewnol. Mae eich neges yn mynd at eich landlord.",
  "message-photos": "photoIds: atodwch luniau o’r adroddiad hwn.",

  "complaint-missing": "Ysgrifennwch eich cwyn.",
  "complaint-too-long": "Cadwch y gŵyn i 5,000 nod neu lai.",
  "escalation-missing": "Ysgrifennwch pam rydych chi’n dal yn anhapus.",
  "escalation-too-long": "Cadwch eich rheswm i 5,000 nod neu lai.",
  "no-such-complaint": "Nid yw’r gŵyn hon yn bodoli.",
  "complaint-already-open":
    "Mae cwyn agored ar yr adroddiad hwn yn barod: ychwanegwch ati, neu gwnewch gwyn newydd ar ôl iddi gau.",
  "complaint-changed": "Mae’r gŵyn hon wedi newid ers i chi ei hagor: ail-lwythwch hi a rhowch gynnig arall arni.",
  "complaint-closed": "Mae’r gŵyn hon wedi cau: gwnewch gwyn newydd os oes rhywbeth yn dal o’i le.",
  "complaint-not-yet-stage-2": "Mae cwyn yn mynd i gam 2 ar ôl i ymateb cam 1 gael ei anfon.",

  "no-such-work-order": "Nid yw’r gwaith hwn yn bodoli.",
  "no-appointment-waiting": "Nid oes apwyntiad yn aros am eich ateb ar gyfer y gwaith hwn.",
  "another-time-asked": "Rydych wedi gofyn am amser arall; bydd eich landlord yn cynnig amser newydd.",
  "another-time-reason": "Dywedwch wrthym pa ddyddiau neu amseroedd sy’n well i chi.",
};

export default cy;
