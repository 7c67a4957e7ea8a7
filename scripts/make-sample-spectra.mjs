// Writes weather-samples/brevenmark-2027-spectra.csv: SIMULATED "measured" spectra (not measurements)
// in lightfold's spectral time-series format, for trying `yield --spectra <file>`. One week (21–27 June
// 2027), one spectrum per daylight hour at mid-hour: the clear-sky global horizontal spectrum of the
// Bird & Riordan model at that instant's sun with Brevenmark's June atmosphere, resampled linearly to
// 300–1200 nm in 5-nm steps. Run after `npm run build`: node scripts/make-sample-spectra.mjs
import { writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const { birdRiordanTable, birdRiordanInto } = await import(join(root, "dist/src/spectrum/birdRiordan.js"));
const { sunPositionAt, dayOfYearUtc } = await import(join(root, "dist/src/sky/sunPosition.js"));
const { spencerEccentricity } = await import(join(root, "dist/src/sky/irradianceBasics.js"));
const { readSiteFile } = await import(join(root, "dist/src/site/siteFile.js"));
const { pressureRatio } = await import(join(root, "dist/src/weather/clearSky.js"));

const site = readSiteFile(join(root, "configs/sites/brevenmark.site.json"));
const t = birdRiordanTable();
const n = t.wavelengthNm.length;
const dir = new Float64Array(n), dif = new Float64Array(n);
const june = 5;
const atm = {
  pressureHpa: 1013.25 * pressureRatio(site.elevationM), precipitableWaterCm: site.precipitableWaterCmMonthly[june],
  ozoneAtmCm: site.ozoneAtmCmMonthly[june], aod500: site.aod500Monthly[june], angstromExponent: site.angstromExponentMonthly[june],
  groundAlbedo: site.albedoMonthly[june],
};
const grid = Array.from({ length: 181 }, (_, i) => 300 + 5 * i);
const at = (y, l) => {
  let j = 0;
  while (t.wavelengthNm[j + 1] < l) j++;
  const f = (l - t.wavelengthNm[j]) / (t.wavelengthNm[j + 1] - t.wavelengthNm[j]);
  return y[j] + f * (y[j + 1] - y[j]);
};
const lines = [
  "# SIMULATED spectra for the invented site Brevenmark (not measurements): clear-sky global horizontal",
  "# spectrum (Bird & Riordan 1986) at mid-hour of each daylight hour, 21-27 June 2027; W m-2 nm-1; made by scripts/make-sample-spectra.mjs",
  ["time", ...grid].join(","),
];
for (let d = 21; d <= 27; d++) {
  for (let h = 0; h < 24; h++) {
    const utc = Date.UTC(2027, june, d, h, 30) - site.utcOffsetHours * 3_600_000;
    const sun = sunPositionAt(utc, site.latitudeDeg, site.longitudeDeg);
    if (sun.zenithDeg >= 85) continue;
    birdRiordanInto(t, sun.zenithDeg, spencerEccentricity(dayOfYearUtc(utc)), atm, dir, dif);
    const cz = Math.cos((sun.zenithDeg * Math.PI) / 180);
    const glob = dir.map((v, i) => v * cz + dif[i]);
    const stamp = `2027-06-${d}T${String(h).padStart(2, "0")}:30:00+01:00`;
    lines.push([stamp, ...grid.map((l) => at(glob, l).toFixed(5))].join(","));
  }
}
writeFileSync(join(root, "weather-samples/brevenmark-2027-spectra.csv"), lines.join("\n") + "\n");
console.log(`wrote weather-samples/brevenmark-2027-spectra.csv: ${lines.length - 3} spectra × ${grid.length} wavelengths`);
