import type { Face } from "./faceSight.js";
import type { RowGeometry } from "./rowGeometry.js";
import { RowScene } from "./rowScene.js";
import { faceShadedFraction, groundShadedFractions, sunProfile } from "./shading.js";
import { faceViewFactors, groundCellSkyViews, type FaceViewFactors } from "./viewFactors.js";

/**
 * Irradiance on the two faces of a row from view factors, after the 2D infinite-row method of Marion
 * et al., "A practical irradiance model for bifacial PV modules", IEEE PVSC 2017 (NREL/CP-5J00-67847):
 * the ground between rows is split into cells, each with its sky view factor and, per hour, its
 * shaded fraction; a cell's radiosity is albedo × (unshaded beam + sky diffuse it sees); a face
 * collects sky diffuse, the cells' radiosity and beam (less the neighbours' shadow) through its view
 * factors. Sky light is isotropic here; neighbouring rows are dark (their reflection is left out).
 */
export interface RowLight {
  scene: RowScene;
  facingAzimuthDeg: number;
  groundSkyView: Float64Array;
  front: FaceViewFactors;
  rear: FaceViewFactors;
}

export function rowLight(g: RowGeometry, facingAzimuthDeg: number, nCells = 100): RowLight {
  const scene = new RowScene(g, nCells);
  return {
    scene,
    facingAzimuthDeg,
    groundSkyView: groundCellSkyViews(scene),
    front: faceViewFactors(scene, "front"),
    rear: faceViewFactors(scene, "rear"),
  };
}

/** One hour's state of the ground and the sun as the faces see it. */
export interface RowHour {
  /** Radiosity of each ground cell, W/m² (Lambertian: radiance = B/π). */
  radiosityWm2: Float64Array;
  /** Cosine of the sun's incidence on the front face (negative: the sun is behind). */
  cosFront: number;
  /** Shaded fraction of the slant for the face the sun is in front of. */
  faceShaded: number;
  shadedScratch: Float64Array;
}

export function rowHour(light: RowLight): RowHour {
  const n = light.scene.nCells;
  return { radiosityWm2: new Float64Array(n), cosFront: 0, faceShaded: 0, shadedScratch: new Float64Array(n) };
}

/**
 * Fills `h` for one hour: ground radiosity B_k = ρ (DNI cos z (1 − shaded_k) + DHI F_k,sky), the
 * sun's incidence on the front face and the shaded fraction of the lit face.
 */
export function updateRowHour(
  light: RowLight, zenithDeg: number, sunAzimuthDeg: number,
  dniWm2: number, dhiWm2: number, albedo: number, h: RowHour,
): RowHour {
  const sceneG = light.scene.geometry;
  const up = zenithDeg < 90;
  const { su, sz } = sunProfile(zenithDeg, sunAzimuthDeg, light.facingAzimuthDeg);
  if (up) groundShadedFractions(light.scene, su, sz, h.shadedScratch);
  else h.shadedScratch.fill(1);
  const beamH = up ? dniWm2 * Math.cos((zenithDeg * Math.PI) / 180) : 0;
  for (let k = 0; k < h.radiosityWm2.length; k++) {
    h.radiosityWm2[k] = albedo * (beamH * (1 - h.shadedScratch[k]!) + dhiWm2 * light.groundSkyView[k]!);
  }
  const b = (sceneG.tiltDeg * Math.PI) / 180;
  // front normal in the 2D frame (sin β, cos β); the sun's along-row part does not reach it
  h.cosFront = up ? su * Math.sin(b) + sz * Math.cos(b) : 0;
  h.faceShaded = up ? faceShadedFraction(light.scene, su, sz) : 0;
  return h;
}

/** Plane irradiance of a face, W/m², split by origin. */
export interface FaceIrradiance {
  beam: number;
  sky: number;
  ground: number;
  total: number;
}

/** E = DHI F_sky + Σ_k B_k F_k + DNI max(0, cos θ_face)(1 − shaded). */
export function faceIrradiance(light: RowLight, face: Face, h: RowHour, dniWm2: number, dhiWm2: number): FaceIrradiance {
  const vf = face === "front" ? light.front : light.rear;
  let ground = 0;
  for (let k = 0; k < vf.ground.length; k++) ground += vf.ground[k]! * h.radiosityWm2[k]!;
  const c = face === "front" ? h.cosFront : -h.cosFront;
  const beam = c > 0 ? dniWm2 * c * (1 - h.faceShaded) : 0;
  const sky = dhiWm2 * vf.sky;
  return { beam, sky, ground, total: beam + sky + ground };
}
