import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { describe, expect, it } from "vitest";
import { RiskPanel } from "@/components/risk/risk-panel";
import { evaluatePoint } from "@/lib/domain";
import { mockApi, unauthenticated } from "./support/api-mock";
import { renderApp } from "./support/render-app";

async function openCalculator() {
  const { fetchMock } = mockApi({ "GET /api/auth/me": unauthenticated });
  renderApp("/calculator");
  const user = userEvent.setup();
  expect(await screen.findByRole("heading", { level: 1, name: "Dew point and surface humidity calculator" })).toBeInTheDocument();
  return { user, fetchMock };
}

const results = () => screen.getByRole("region", { name: "Result" });
const figure = (term: string) => within(results()).getByText(term, { selector: "dt" }).nextElementSibling;

describe("dew point calculator", () => {
  it("starts empty with a prompt", async () => {
    await openCalculator();
    expect(screen.getByLabelText(/^Room temperature/)).toHaveValue("");
    expect(screen.getByLabelText(/^Relative humidity/)).toHaveValue("");
    expect(within(results()).getByText("Results appear here as you type")).toBeInTheDocument();
    // Said whatever the numbers, before there are any.
    expect(screen.getByText(/Whatever these numbers say, if you see damp or mould, tell your landlord/)).toBeInTheDocument();
  });

  it("shows condensing and the dew point as the values are typed, without sending them anywhere", async () => {
    const { user, fetchMock } = await openCalculator();
    const apiCallsBefore = fetchMock.mock.calls.length;
    await user.type(screen.getByLabelText(/^Room temperature/), "19");
    await user.type(screen.getByLabelText(/^Relative humidity/), "78");
    await user.type(screen.getByLabelText(/^Surface temperature/), "9");

    expect(await within(results()).findByText("Condensing")).toBeInTheDocument();
    // Source: Magnus form, Alduchov & Eskridge (1996), derived by hand (TRADE.md §1):
    // γ = ln 0.78 + 17.625·19/(243.04 + 19) = 1.02949; Td = 243.04·γ/(17.625 − γ) = 15.08 °C → shown as 15.1 °C.
    expect(figure("Dew point")).toHaveTextContent("15.1 °C");
    expect(figure("Surface temperature")).toHaveTextContent("9.0 °C");
    expect(figure("Surface temperature")).toHaveTextContent("Measured");
    // The engine's reason is listed.
    expect(within(results()).getByText(/below the air's dew point of 15\.1 °C/)).toBeInTheDocument();
    // The polite summary follows once typing pauses.
    const status = within(results()).getByRole("status");
    expect(status).toHaveAttribute("aria-live", "polite");
    await expect.poll(() => status.textContent, { timeout: 2000 }).toMatch(/Condensing.*Dew point 15\.1 °C/);
    expect(fetchMock.mock.calls.length).toBe(apiCallsBefore);
  });

  it("fills the example values from the button", async () => {
    const { user } = await openCalculator();
    await user.click(screen.getByRole("button", { name: "Try an example" }));
    expect(screen.getByLabelText(/^Room temperature/)).toHaveValue("19");
    expect(screen.getByLabelText(/^Relative humidity/)).toHaveValue("78");
    expect(screen.getByLabelText(/^Surface temperature/)).toHaveValue("9");
    expect(await within(results()).findByText("Condensing")).toBeInTheDocument();
  });

  it("shows the schema's message beside a humidity over 100 % and keeps the last result, marked as out of date", async () => {
    const { user } = await openCalculator();
    await user.click(screen.getByRole("button", { name: "Try an example" }));
    const rh = screen.getByLabelText(/^Relative humidity/);
    await user.clear(rh);
    await user.type(rh, "101");

    // The schema's own message (src/lib/schemas/psychrometrics.ts), with the field named as on the form.
    await expect.poll(() => rh.getAttribute("aria-invalid")).toBe("true");
    expect(rh).toHaveAccessibleDescription(expect.stringContaining("Relative humidity must be at most 100 %."));
    expect(within(results()).getByText(/A value needs correcting/)).toBeInTheDocument();
    // The last valid values were "10" on the way to "101": that result stays, marked as out of date.
    const stale = results().querySelector("[data-stale]");
    expect(stale).not.toBeNull();
    expect(within(stale as HTMLElement).getByText("Dry")).toBeInTheDocument();
  });

  it("shows the prompt again when the humidity is cleared", async () => {
    const { user } = await openCalculator();
    await user.click(screen.getByRole("button", { name: "Try an example" }));
    expect(await within(results()).findByText("Condensing")).toBeInTheDocument();
    const rh = screen.getByLabelText(/^Relative humidity/);
    await user.clear(rh);

    expect(await within(results()).findByText("Results appear here as you type")).toBeInTheDocument();
    expect(within(results()).getByText(/Enter the relative humidity/)).toBeInTheDocument();
    expect(within(results()).queryByText("Condensing")).not.toBeInTheDocument();
    // A blank field is not an error: the prompt says what is missing.
    expect(rh).not.toHaveAttribute("aria-invalid");
  });

  it("estimates the surface from the element and the outdoor temperature", async () => {
    const { user } = await openCalculator();
    await user.type(screen.getByLabelText(/^Room temperature/), "19");
    await user.type(screen.getByLabelText(/^Relative humidity/), "78");
    await user.type(screen.getByLabelText(/^Outdoor temperature/), "0");
    await user.selectOptions(screen.getByLabelText(/^Building element/), "Single glazing");

    const surface = await within(results()).findByText("Surface temperature", { selector: "dt" });
    // θsi = θe + fRsi·(θi − θe) with fRsi = 1 − 5.7·0.13 = 0.259 (TRADE.md §2, derived): 0 + 0.259·19 = 4.9 °C.
    expect(surface.nextElementSibling).toHaveTextContent("4.9 °C");
    expect(surface.nextElementSibling).toHaveTextContent("Estimated from the outdoor temperature and the element");
    expect(figure("Temperature factor")).toHaveTextContent("0.26");
    expect(figure("Temperature factor")).toHaveTextContent(/Below the 0\.75 that BRE IP 1\/06 asks/);
  });

  it("takes the surface at air temperature when nothing else is given, and says so", async () => {
    const { user } = await openCalculator();
    await user.type(screen.getByLabelText(/^Room temperature/), "20");
    await user.type(screen.getByLabelText(/^Relative humidity/), "50");
    expect(await within(results()).findByText("Dry")).toBeInTheDocument();
    expect(figure("Surface temperature")).toHaveTextContent(/Taken at air temperature/);
    expect(within(results()).queryByText("Temperature factor", { selector: "dt" })).not.toBeInTheDocument();
    // Source: TRADE.md §1, 20 °C / 50 % → 9.27 °C [D, Hyland–Wexler].
    expect(figure("Dew point")).toHaveTextContent("9.3 °C");
  });
});

describe("dew point calculator below 0 °C", () => {
  it("shows the frost point in plain words when the dew point is below 0 °C, and not otherwise", async () => {
    const { user } = await openCalculator();
    await user.type(screen.getByLabelText(/^Room temperature/), "-5");
    await user.type(screen.getByLabelText(/^Relative humidity/), "80");
    await user.type(screen.getByLabelText(/^Surface temperature/), "-7.3");
    // RH over water (WMO-No. 8 Annex 4.B), worked by hand from its formulas: pv = 0.8 × 422.19 = 337.75 Pa,
    // g = ln(337.75/611.2) = −0.59311; dew point 243.12·g/(17.62 − g) = −7.92 °C, frost point
    // 272.62·g/(22.46 − g) = −7.01 °C. A surface at −7.3 °C is judged over ice (ISO 13788): frost forms.
    expect(await within(results()).findByText("Condensing")).toBeInTheDocument();
    expect(figure("Dew point")).toHaveTextContent("-7.9 °C");
    expect(figure("Frost point")).toHaveTextContent("-7.0 °C");
    expect(figure("Frost point")).toHaveTextContent("Frost would form on a surface at -7.0 °C or colder.");
    expect(within(results()).getByText(/frost point of -7\.0 °C, so frost forms on it/)).toBeInTheDocument();
    const status = within(results()).getByRole("status");
    await expect.poll(() => status.textContent, { timeout: 2000 }).toMatch(/Dew point -7\.9 °C; frost point -7\.0 °C/);

    // Warm enough that the dew point is above 0 °C: no frost point at all.
    await user.clear(screen.getByLabelText(/^Room temperature/));
    await user.type(screen.getByLabelText(/^Room temperature/), "19");
    await user.clear(screen.getByLabelText(/^Surface temperature/));
    await user.type(screen.getByLabelText(/^Surface temperature/), "9");
    // 19 °C / 80 %: Magnus (Alduchov & Eskridge 1996) by hand, γ = ln 0.8 + 17.625·19/262.04 = 1.05481,
    // Td = 243.04·γ/(17.625 − γ) = 15.47 °C.
    expect(await within(results()).findByText(/below the air's dew point of 15\.5 °C/)).toBeInTheDocument();
    expect(within(results()).queryByText("Frost point", { selector: "dt" })).toBeNull();
  });
});

describe("risk panel on its own", () => {
  it("names the state in words, with a heading when given a title, and folds the reasons away when compact", () => {
    const result = evaluatePoint({
      airTemperatureC: 20,
      relativeHumidityPct: 60,
      surfaceTemperatureC: 16,
      outdoorTemperatureC: 0,
    });
    render(<RiskPanel result={result} title="Bedroom window" headingLevel={3} compact />);
    const panel = screen.getByRole("region", { name: "Bedroom window" });
    expect(within(panel).getByRole("heading", { level: 3, name: "Bedroom window" })).toBeInTheDocument();
    expect(
      within(panel)
        .getByText(/Surface state:/)
        .closest("p"),
    ).toHaveTextContent("Surface state: Borderline");
    // Measured factor (16 − 0)/(20 − 0) = 0.80, at or above BRE IP 1/06's 0.75 (TRADE.md §2), yet the surface is at 77 % RH:
    // borderline, consistent with the ISO 13788 worked example (20 °C / 60 % / 0 °C needs fRsi ≥ 0.77).
    const factorTerm = within(panel).getByText("Temperature factor", { selector: "dt" });
    expect(factorTerm.nextElementSibling).toHaveTextContent("0.80");
    expect(factorTerm.nextElementSibling).toHaveTextContent(/At or above the 0\.75/);
    expect(within(panel).getByText("Why this result", { selector: "summary" })).toBeInTheDocument();
  });
});
