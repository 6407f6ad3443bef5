// Writes cie1931-anchors.json: the CIE 1931 2° colour-matching functions
// at the wavelengths that anchor Brettel, Viénot & Mollon's (1997)
// dichromat half-planes (475 and 575 nm for protan and deutan, 485 and
// 660 nm for tritan), as the npm package spectral-color tabulates them.
// brettel_test.go checks the constants in brettel.go against the file.
//
//   cd perception/colour/testdata
//   npm install --no-save spectral-color@0.1.0
//   node cie1931-anchors.mjs > cie1931-anchors.json
import { cmfs } from 'spectral-color';

const c = cmfs.CIE_1931_2DEG;
const out = { source: 'spectral-color 0.1.0, cmfs.CIE_1931_2DEG', nm: {} };
for (const nm of [475, 485, 575, 660]) {
  const i = (nm - c.shape.start) / c.shape.interval;
  out.nm[nm] = c.samples[i];
}
console.log(JSON.stringify(out, null, 2));
