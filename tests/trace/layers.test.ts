import { describe, it } from "vitest";
import { filmStack } from "../../src/optics/thinFilm.js";
import { constantMaterial, expectWithin4Sigma, fresnelRsRp, registryWith, runTrace, stackOf } from "./helpers.js";

// Air | 1 mm glass-like layer (n = 1.5, α = 2e-4/µm) | opaque absorber (n = 3.6, k = 0.5).
const N_GLASS = 1.5;
const ALPHA_GLASS = 2e-4;
const D_UM = 1000;
const ABS = { n: 3.6, k: 0.5 };
const registry = registryWith(
  constantMaterial("cover", N_GLASS, (ALPHA_GLASS * 1.0) / (4 * Math.PI)),
  constantMaterial("opaque", ABS.n, ABS.k),
);
const stack = stackOf({
  layers: [{ name: "cover", material: "cover", thicknessUm: D_UM, topFilms: [] }],
  absorber: { material: "opaque", thicknessUm: 100 },
  rear: { ideal: { kind: "mirror", reflectance: 1 } },
});

describe("traceBatch through a thick incoherent layer (closed form, one polarisation at a time)", () => {
  for (const thetaDeg of [0, 40]) {
    for (const pol of ["s", "p"] as const) {
      it(`θ = ${thetaDeg}°, ${pol}: R, A_layer, A_absorber within 4σ`, () => {
        // Incoherent sum between the top face (R1, lossless) and the bottom face onto the opaque
        // absorber (R2, complex Fresnel): R = R1 + (1−R1)²τ²R2/(1 − R1R2τ²),
        // A_abs = (1−R1)τ(1−R2)/(1 − R1R2τ²), τ = exp(−αd/cosθ_layer).
        const top = fresnelRsRp(1, N_GLASS, Math.cos((thetaDeg * Math.PI) / 180));
        const R1 = pol === "s" ? top.Rs : top.Rp;
        const bottom = filmStack(N_GLASS, [], ABS, 1000, top.cosT);
        const R2 = pol === "s" ? bottom.Rs : bottom.Rp;
        const tau = Math.exp((-ALPHA_GLASS * D_UM) / top.cosT);
        const den = 1 - R1 * R2 * tau * tau;
        const R = R1 + ((1 - R1) ** 2 * tau * tau * R2) / den;
        const A = ((1 - R1) * tau * (1 - R2)) / den;
        const run = runTrace(stack, registry, { thetaDeg, polarization: pol, nRays: 20000, seed: 31 + thetaDeg });
        const tag = `layer θ=${thetaDeg}° ${pol}`;
        expectWithin4Sigma(`${tag} R`, run.total("R"), R);
        expectWithin4Sigma(`${tag} A_absorber`, run.get("A_absorber"), A);
        expectWithin4Sigma(`${tag} A_layer`, run.get("A_layer:cover"), 1 - R - A);
      });
    }
  }
});
