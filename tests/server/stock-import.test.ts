// The stock import against the run's real MariaDB: an admin's asset register (CSV with real-world
// mess, or .xlsx) into the landlord's homes, upserted by UPRN, one transaction per import.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { parse as parseCsv } from "csv-parse/sync";
import ExcelJS from "exceljs";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { StockImportService } from "../../server/modules/properties/stock-import.service.js";
import { makeLandlord, makeProperty, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";

let t: TestApp;
const dir = mkdtempSync(path.join(tmpdir(), "dewline-stock-test-"));

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t?.close();
  rmSync(dir, { recursive: true, force: true });
});

async function adminOfNewLandlord() {
  const landlord = await makeLandlord(t.ctx.dataSource);
  const admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  return { landlord, admin, officer };
}

const HEADER =
  "UPRN;Address;Estate;Property Type;Wall Construction;Wall Insulation;Glazing;Loft insulation;Heating;Fuel;Extract fans;Trickle vents;Ventilation;Floor Area (sq ft);EPC Rating;Year built;Rooms";

/** A register as a housing system exports it: BOM, CRLF, semicolons, one merged address column. */
function messyRegister(glazingOfBirchClose = "Single glazed"): Buffer {
  const lines = [
    HEADER,
    '100023336956;"12 Elm Road, Flat 3, Leeds, ls1 4ab";Elm Estate;Flat;Cavity – filled;;Double glazed (post 2002);270mm;Gas combi boiler;Mains gas;Yes;No;;753;C (72);1965;"Bedroom 1; Kitchen; Bathroom"',
    '12345678901234;"1 Oak Street, Leeds, LS2 7EX";;Flat;Cavity – filled;;Double;;Gas combi boiler;;;;;;;;',
    '100023336957;"2 Oak Street, Leeds, XX99 9XX9";;Flat;Cavity – filled;;Double;;Gas combi boiler;;;;;;;;',
    '100023336956;"12 Elm Road, Flat 3, Leeds, LS1 4AB";Elm Estate;Flat;Cavity – filled;;Double;;Gas combi boiler;;;;;;;;',
    ';"5 Ash Lane, Leeds, LS3 1AA";;Flat;Cavity – filled;;Double;;Gas combi boiler;;;;;;;;',
    `100023336958;"7 Birch Close, Headingley, Leeds, LS6 3AB";;Mid terrace house;Solid brick;;${glazingOfBirchClose};None;Electric storage heaters;;;;;;;pre 1919;`,
    '100023336959;"9 Cedar Way, Leeds, LS7 2CD";Cedar Estate;Semi-detached;Cavity wall, insulated;;Double;100;Gas boiler;;;;PIV;;D;1945-1964;',
    '100023336960;"10 Cedar Way, Leeds, LS7 2CD";Cedar Estate;Igloo;Solid brick;;Double;;Gas boiler;;;;;;;;',
    '100023336961;"11 Cedar Way, Leeds, LS7 2CD";Cedar Estate;Semi-detached;;;Double;;Gas boiler;;;;;;;;',
    '=HYPERLINK("http://x");"1 X Road, Leeds, LS1 1AA";;Flat;Solid brick;;Double;;Gas boiler;;;;;;;;',
  ];
  return Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(lines.join("\r\n") + "\r\n", "utf8")]);
}

const upload = (client: Client, url: string, file: Buffer, name: string, mapping?: object) => {
  const req = client.agent.post(url).set("X-CSRF-Token", client.csrf);
  if (mapping) req.field("mapping", JSON.stringify(mapping));
  return req.attach("file", file, name);
};

async function reportOf(client: Client, url: string): Promise<string[][]> {
  const res = await client.agent.get(url).expect(200);
  expect(res.headers["content-type"]).toMatch(/text\/csv/);
  return parseCsv(res.text, { relax_column_count: true }) as string[][];
}

const homesOf = async (orgId: number) =>
  // The landlord factory's own home has no UPRN: only the imported ones count.
  (await t.ctx.dataSource.query("SELECT * FROM properties WHERE organisation_id = ? AND uprn IS NOT NULL ORDER BY uprn", [
    orgId,
  ])) as Record<string, unknown>[];

describe("the stock import", () => {
  it("previews a messy CSV: separator, BOM and the proposed mapping", async () => {
    const { admin } = await adminOfNewLandlord();
    const res = await upload(admin, "/api/stock-imports/preview", messyRegister(), "register.csv").expect(200);
    expect(res.body.format).toBe("csv");
    expect(res.body.delimiter).toBe(";");
    expect(res.body.headers[0]).toBe("UPRN");
    expect(res.body.mapping).toEqual({
      uprn: 0,
      address: 1,
      estate: 2,
      builtForm: 3,
      wallConstruction: 4,
      wallInsulation: 5,
      glazing: 6,
      roofInsulation: 7,
      heating: 8,
      heatingFuel: 9,
      extractFans: 10,
      trickleVents: 11,
      ventilation: 12,
      floorArea: 13,
      epcBand: 14,
      yearBuilt: 15,
      rooms: 16,
    });
    expect(res.body.sampleRows[0][0]).toBe("100023336956");
    expect(res.body.sampleRows).toHaveLength(10);
    expect(res.body.missing).toEqual([]);
  });

  it("imports each row with its exact outcome, and a repeat import changes nothing", async () => {
    const { landlord, admin } = await adminOfNewLandlord();
    const first = await upload(admin, "/api/stock-imports", messyRegister(), "register.csv").expect(201);
    expect(first.body).toMatchObject({ fileName: "register.csv", created: 3, updated: 0, unchanged: 0, refused: 7 });

    const report = await reportOf(admin, first.body.reportUrl);
    expect(report).toEqual([
      ["line", "uprn", "outcome", "changed", "details"],
      ["2", "100023336956", "created", "", ""],
      ["3", "12345678901234", "refused", "", 'UPRN "12345678901234" is not a number of up to 12 digits.'],
      ["4", "100023336957", "refused", "", 'Postcode "XX99 9XX9" is not a UK postcode.'],
      ["5", "100023336956", "refused", "", "UPRN 100023336956 is already on line 2 of this file."],
      ["6", "", "refused", "", "No UPRN: homes are matched by their UPRN."],
      ["7", "100023336958", "created", "", ""],
      ["8", "100023336959", "created", "", ""],
      ["9", "100023336960", "refused", "", 'Built form "Igloo" is not one we recognise.'],
      ["10", "100023336961", "refused", "", "A new home needs its wall construction: the risk engine reads them."],
      ["11", `'=HYPERLINK("http://x")`, "refused", "", 'UPRN "=HYPERLINK("http://x")" is not a number of up to 12 digits.'],
    ]);

    const homes = await homesOf(landlord.org.id);
    const elm = homes.find((h) => h.uprn === "100023336956")!;
    expect(elm).toMatchObject({
      address_line1: "12 Elm Road",
      address_line2: "Flat 3",
      town: "Leeds",
      postcode: "LS1 4AB",
      estate: "Elm Estate",
      built_form: "flat",
      wall_type: "filled-cavity",
      wall_insulation: "cavity-fill",
      glazing_type: "modern-double",
      roof_insulation_mm: 270,
      heating_type: "gas-boiler",
      heating_fuel: "mains-gas",
      has_extract_fans: 1,
      has_trickle_vents: 0,
      ventilation: "extract-fans",
      // 753 sq ft × 0.09290304 m²/sq ft = 69.96 m² (the international foot; from memory)
      floor_area_m2: "70.0",
      epc_band: "C",
      built_year: 1965,
      age_band: null,
    });
    const rooms = (await t.ctx.dataSource.query("SELECT name, kind FROM rooms WHERE property_id = ? ORDER BY id", [elm.id])) as {
      name: string;
      kind: string;
    }[];
    expect(rooms).toEqual([
      { name: "Bedroom 1", kind: "bedroom" },
      { name: "Kitchen", kind: "kitchen" },
      { name: "Bathroom", kind: "bathroom" },
    ]);
    const birch = homes.find((h) => h.uprn === "100023336958")!;
    expect(birch).toMatchObject({
      address_line2: "Headingley",
      estate: "Birch Close",
      built_form: "mid-terrace",
      wall_type: "solid-brick",
      glazing_type: "single",
      heating_type: "electric-storage",
      roof_insulation_mm: 0,
      age_band: "before 1919",
      ventilation: "not-recorded",
    });
    expect(homes.find((h) => h.uprn === "100023336959")).toMatchObject({
      wall_type: "filled-cavity",
      ventilation: "piv",
      age_band: "1945-1964",
    });

    // The same file again: nothing new, nothing changed, the same refusals.
    const again = await upload(admin, "/api/stock-imports", messyRegister(), "register.csv").expect(201);
    expect(again.body).toMatchObject({ created: 0, updated: 0, unchanged: 3, refused: 7 });
    expect(await homesOf(landlord.org.id)).toHaveLength(3);
    expect((await t.ctx.dataSource.query("SELECT COUNT(*) AS n FROM rooms WHERE property_id = ?", [elm.id]))[0].n).toBe("3");

    // One home's glazing changed in the register: that home alone is updated, and the field is named.
    const changed = await upload(admin, "/api/stock-imports", messyRegister("Double glazed 2015"), "register.csv").expect(201);
    expect(changed.body).toMatchObject({ created: 0, updated: 1, unchanged: 2, refused: 7 });
    const changedReport = await reportOf(admin, changed.body.reportUrl);
    expect(changedReport.find((r) => r[0] === "7")).toEqual(["7", "100023336958", "updated", "glazingType", ""]);
    expect((await homesOf(landlord.org.id)).find((h) => h.uprn === "100023336958")!.glazing_type).toBe("modern-double");
    expect(await homesOf(landlord.org.id)).toHaveLength(3);

    const list = await admin.get("/api/stock-imports").expect(200);
    expect(list.body.imports.map((i: { id: number }) => i.id)).toEqual([changed.body.id, again.body.id, first.body.id]);
  });

  it("stores free text exactly as written: a backslash, a tab, a line break and letters beyond ASCII", async () => {
    const { landlord, admin } = await adminOfNewLandlord();
    const file = Buffer.from(
      [
        "UPRN,Address 1,Address 2,Town,Postcode,Estate,Block,Built form,Walls,Glazing,Heating",
        '100088880001,"Flat 2\\B, Tŷ Glas","Rear\tdoor",Caerdydd,CF10 1AA,"Parc\nUchaf",Bloc – Ä,Flat,Solid brick,Double,Gas boiler',
      ].join("\n") + "\n",
      "utf8",
    );
    const res = await upload(admin, "/api/stock-imports", file, "register.csv").expect(201);
    expect(res.body.created).toBe(1);
    const [home] = await homesOf(landlord.org.id);
    expect(home).toMatchObject({
      address_line1: "Flat 2\\B, Tŷ Glas",
      address_line2: "Rear\tdoor",
      town: "Caerdydd",
      estate: "Parc\nUchaf",
      block: "Bloc – Ä",
      postcode: "CF10 1AA",
    });
  });

  it("imports an Excel workbook, with numbers as numbers and separate address columns", async () => {
    const { landlord, admin } = await adminOfNewLandlord();
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet("Stock");
    ws.addRow([
      "Unique Property Reference Number",
      "Address 1",
      "Address 2",
      "Town",
      "Post Code",
      "Built Form",
      "Walls",
      "Glazing",
      "Heating",
      "Floor area (m²)",
      "EPC",
    ]);
    ws.addRow([
      100099990001,
      "3 Larch Grove",
      null,
      "York",
      "yo1 7hh",
      "Bungalow",
      "Timber frame",
      "Triple glazed",
      "Air source heat pump",
      72.5,
      "B",
    ]);
    ws.addRow([
      100099990002,
      "4 Larch Grove",
      "Annexe",
      "York",
      "YO1 7HH",
      "Detached",
      "Solid stone",
      "Mixed",
      "Oil boiler",
      140,
      "E",
    ]);
    const file = Buffer.from(await wb.xlsx.writeBuffer());

    const preview = await upload(admin, "/api/stock-imports/preview", file, "stock.xlsx").expect(200);
    expect(preview.body).toMatchObject({ format: "xlsx", delimiter: null });
    expect(preview.body.mapping).toMatchObject({
      uprn: 0,
      addressLine1: 1,
      addressLine2: 2,
      town: 3,
      postcode: 4,
      floorArea: 9,
      epcBand: 10,
    });

    const res = await upload(admin, "/api/stock-imports", file, "stock.xlsx").expect(201);
    expect(res.body).toMatchObject({ created: 2, refused: 0 });
    const homes = await homesOf(landlord.org.id);
    expect(
      homes.map((h) => [
        h.uprn,
        h.postcode,
        h.built_form,
        h.wall_type,
        h.glazing_type,
        h.heating_type,
        h.heating_fuel,
        h.floor_area_m2,
        h.epc_band,
      ]),
    ).toEqual([
      ["100099990001", "YO1 7HH", "bungalow", "timber-frame", "triple", "heat-pump", "electricity", "72.5", "B"],
      ["100099990002", "YO1 7HH", "detached", "solid-stone", "mixed", "other", "oil", "140.0", "E"],
    ]);
    // The homes API shows the new fields.
    const one = await admin.get(`/api/properties/${homes[0]!.id as number}`).expect(200);
    expect(one.body).toMatchObject({ floorAreaM2: 72.5, epcBand: "B", heatingFuel: "electricity" });
  });

  it("takes the admin's corrections to the mapping", async () => {
    const { landlord, admin } = await adminOfNewLandlord();
    const res = await upload(admin, "/api/stock-imports", messyRegister(), "register.csv", {
      epcBand: null,
      estate: null,
    }).expect(201);
    expect(res.body.created).toBe(3);
    const elm = (await homesOf(landlord.org.id)).find((h) => h.uprn === "100023336956")!;
    expect(elm).toMatchObject({ epc_band: null, estate: "Elm Road" });

    await upload(admin, "/api/stock-imports", messyRegister(), "register.csv", { uprn: 99 }).expect(400);
    await upload(admin, "/api/stock-imports", messyRegister(), "register.csv", { uprn: null }).expect(422);
  });

  it("leaves nothing of an import that fails half-way", async () => {
    const { landlord } = await adminOfNewLandlord();
    const admin = {
      id: landlord.admin.id,
      email: landlord.admin.email,
      name: landlord.admin.name,
      role: "admin" as const,
      organisationId: landlord.org.id,
    };
    const rows = Array.from(
      { length: 9 },
      (_, i) => `1000777000${i + 10},${i + 1} Pine Road,Hull,HU1 1AA,Flat,Solid brick,Single,Gas boiler`,
    );
    const file = path.join(dir, "half.csv");
    writeFileSync(file, ["UPRN,Address 1,Town,Postcode,Property type,Walls,Glazing,Heating", ...rows].join("\n"));
    // Batches of 2: the failure comes after four homes have been read and sent to MariaDB.
    const service = new StockImportService(t.ctx.dataSource, testClock, undefined, 2);
    let stored = 0;
    let fails = 0;
    await expect(
      service.import(admin, {
        filePath: file,
        fileName: "half.csv",
        onBatch: async () => {
          stored = (await homesOf(landlord.org.id)).length; // outside the transaction: nothing yet
          if (++fails === 2) throw new Error("the disk is full");
        },
      }),
    ).rejects.toThrow("the disk is full");
    expect(stored).toBe(0);
    expect(await homesOf(landlord.org.id)).toEqual([]);
    expect(
      (await t.ctx.dataSource.query("SELECT COUNT(*) AS n FROM stock_imports WHERE organisation_id = ?", [landlord.org.id]))[0].n,
    ).toBe("0");

    // The same file with nothing failing imports all nine, here through five LOAD DATA statements of two.
    const ok = await new StockImportService(t.ctx.dataSource, testClock, undefined, 2, 2).import(admin, {
      filePath: file,
      fileName: "half.csv",
    });
    expect(ok.created).toBe(9);
    expect((await homesOf(landlord.org.id)).map((h) => h.address_line1)).toEqual(rows.map((r) => r.split(",")[1]));
  });

  it("fails cleanly, leaving nothing of itself, when a home with a UPRN of the file is added while it runs", async () => {
    const { landlord } = await adminOfNewLandlord();
    const admin = {
      id: landlord.admin.id,
      email: landlord.admin.email,
      name: landlord.admin.name,
      role: "admin" as const,
      organisationId: landlord.org.id,
    };
    const rows = [1, 2, 3].map((i) => `10007770010${i},${i} Larch Road,Hull,HU1 1AA,Flat,Solid brick,Single,Gas boiler`);
    const file = path.join(dir, "raced.csv");
    writeFileSync(file, ["UPRN,Address 1,Town,Postcode,Property type,Walls,Glazing,Heating", ...rows].join("\n"));
    const service = new StockImportService(t.ctx.dataSource, testClock);
    // Another session adds the second home after the import has read what the landlord holds.
    const raced = service.import(admin, {
      filePath: file,
      fileName: "raced.csv",
      afterSnapshot: async () => {
        await makeProperty(t.ctx.dataSource, landlord.org, { uprn: "100077700102", addressLine1: "Added meanwhile" });
      },
    });
    await expect(raced).rejects.toThrow("Homes with UPRNs in this file were added while the import ran");
    const homes = await homesOf(landlord.org.id);
    expect(homes.map((h) => [h.uprn, h.address_line1])).toEqual([["100077700102", "Added meanwhile"]]);
    expect(
      (await t.ctx.dataSource.query("SELECT COUNT(*) AS n FROM stock_imports WHERE organisation_id = ?", [landlord.org.id]))[0].n,
    ).toBe("0");

    // Imported again, the file updates the home added meanwhile and creates the other two.
    const again = await service.import(admin, { filePath: file, fileName: "raced.csv" });
    expect(again).toMatchObject({ created: 2, updated: 1, refused: 0 });
  });

  it("runs two imports of one landlord one after the other", async () => {
    const { landlord } = await adminOfNewLandlord();
    const admin = {
      id: landlord.admin.id,
      email: landlord.admin.email,
      name: landlord.admin.name,
      role: "admin" as const,
      organisationId: landlord.org.id,
    };
    const rows = [1, 2, 3, 4].map((i) => `10007770020${i},${i} Yew Road,Hull,HU1 1AA,Flat,Solid brick,Single,Gas boiler`);
    const file = path.join(dir, "twice.csv");
    writeFileSync(file, ["UPRN,Address 1,Town,Postcode,Property type,Walls,Glazing,Heating", ...rows].join("\n"));
    const service = new StockImportService(t.ctx.dataSource, testClock, undefined, 1);
    let release!: () => void;
    const held = new Promise<void>((resolve) => (release = resolve));
    let firstReading = false;
    const first = service.import(admin, {
      filePath: file,
      fileName: "twice.csv",
      onBatch: async () => {
        firstReading = true;
        await held;
      },
    });
    await vi.waitFor(() => expect(firstReading).toBe(true));
    const second = service.import(admin, { filePath: file, fileName: "twice.csv" });
    const waiting = async () =>
      Number(
        (
          await t.ctx.dataSource.query(
            "SELECT COUNT(*) AS n FROM information_schema.PROCESSLIST WHERE STATE = 'User lock' AND INFO LIKE 'SELECT GET_LOCK%'",
          )
        )[0].n,
      );
    await vi.waitFor(async () => expect(await waiting()).toBe(1), { timeout: 10_000 });
    release();
    const [a, b] = await Promise.all([first, second]);
    // Whichever ran second found every home there: none is created twice, neither import fails.
    expect([a.created, b.created].sort()).toEqual([0, 4]);
    expect([a.unchanged, b.unchanged].sort()).toEqual([0, 4]);
    expect(await homesOf(landlord.org.id)).toHaveLength(4);
  });

  it("keeps each landlord's imports and homes to itself", async () => {
    const first = await adminOfNewLandlord();
    const second = await adminOfNewLandlord();
    const done = await upload(first.admin, "/api/stock-imports", messyRegister(), "register.csv").expect(201);

    await second.admin.get(`/api/stock-imports/${done.body.id}`).expect(404);
    await second.admin.get(`/api/stock-imports/${done.body.id}/report.csv`).expect(404);
    expect((await second.admin.get("/api/stock-imports").expect(200)).body.imports).toEqual([]);
    await first.officer.get(`/api/stock-imports/${done.body.id}`).expect(403);
    await upload(first.officer, "/api/stock-imports", messyRegister(), "register.csv").expect(403);

    // The same UPRNs for another landlord are that landlord's own homes; the first's stay as they were.
    const theirs = await upload(second.admin, "/api/stock-imports", messyRegister("Triple glazed"), "register.csv").expect(201);
    expect(theirs.body).toMatchObject({ created: 3, updated: 0 });
    expect((await homesOf(first.landlord.org.id)).find((h) => h.uprn === "100023336958")!.glazing_type).toBe("single");
  });

  it("refuses what is not a register", async () => {
    const { admin } = await adminOfNewLandlord();
    await upload(admin, "/api/stock-imports/preview", Buffer.alloc(0), "empty.csv").expect(422);
    await upload(admin, "/api/stock-imports/preview", Buffer.from([0xff, 0xfe, 0x41, 0x00]), "utf16.csv").expect(422);
    await admin.agent.post("/api/stock-imports").set("X-CSRF-Token", admin.csrf).expect(400);
    await upload(admin, "/api/stock-imports", Buffer.from("UPRN,Address 1\n"), "header-only.csv").expect(422);
  });
});
