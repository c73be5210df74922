// Own Bessel functions against @stdlib (the reference package) and against identities of A&S ch. 9.
import { describe, it, expect } from "vitest";
import j0ref from "@stdlib/math-base-special-besselj0";
import j1ref from "@stdlib/math-base-special-besselj1";
import { besselJ0, besselJ1, besselJnArray, fastJ0, fastJ1, prepareFastJ0, prepareFastJ1 } from "@/lib/optics/bessel";

function grid(): number[] {
  const xs: number[] = [];
  for (let i = 0; i <= 40000; i++) xs.push(i * 0.001); // 0 … 40, fine, through every branch boundary
  for (let i = 0; i <= 4000; i++) xs.push(40 * Math.pow(2500, i / 4000)); // 40 … 1e5, log-spaced
  xs.push(8, 8 + 1e-12, 25, 25 - 1e-12, 2.404825557695773, 5.520078110286311, 3.831705970207512);
  return xs;
}

describe("J0 and J1 against @stdlib/math-base-special-besselj0/j1 (reference package)", () => {
  it("J0 agrees to 1e-12 absolute over 0 … 1e5", () => {
    let worst = 0;
    for (const x of grid()) worst = Math.max(worst, Math.abs(besselJ0(x) - j0ref(x)), Math.abs(besselJ0(-x) - j0ref(x)));
    expect(worst).toBeLessThan(1e-12);
  });
  it("J1 agrees to 1e-12 absolute over 0 … 1e5 and is odd", () => {
    let worst = 0;
    for (const x of grid()) worst = Math.max(worst, Math.abs(besselJ1(x) - j1ref(x)), Math.abs(besselJ1(-x) + j1ref(x)));
    expect(worst).toBeLessThan(1e-12);
  });
  it("tabulated J0 (Hermite) stays within 2e-8 of the reference", () => {
    prepareFastJ0(9000);
    let worst = 0;
    for (let i = 0; i < 200000; i++) {
      const x = i * 0.0451;
      worst = Math.max(worst, Math.abs(fastJ0(x) - j0ref(x)));
    }
    expect(worst).toBeLessThan(2e-8);
  });
  it("tabulated J1 (Hermite, J1' = J0 − J1/x) stays within 2e-8 of the reference, beyond the table too", () => {
    prepareFastJ1(9000);
    let worst = 0;
    for (let i = 0; i < 200000; i++) {
      const x = i * 0.0451;
      worst = Math.max(worst, Math.abs(fastJ1(x) - j1ref(x)));
    }
    expect(worst).toBeLessThan(2e-8);
  });
});

describe("Miller backward recurrence J_n (A&S 9.1.27, 9.1.46; Numerical Recipes §6.5)", () => {
  it("J0, J1 from the recurrence match the reference at many x", () => {
    for (const x of [0.1, 1, 3.7, 10, 24.9, 60, 150]) {
      const j = besselJnArray(30, x);
      expect(Math.abs(j[0] - j0ref(x))).toBeLessThan(1e-13);
      expect(Math.abs(j[1] - j1ref(x))).toBeLessThan(1e-13);
    }
  });
  it("tabulated values: J5(10) = −0.2340615281867936, J10(10) = 0.2074861066333589 (A&S Table 9.2)", () => {
    const j = besselJnArray(10, 10);
    expect(j[5]).toBeCloseTo(-0.2340615281867936, 14);
    expect(j[10]).toBeCloseTo(0.2074861066333589, 14);
  });
  it("satisfies the three-term recurrence and the sum rule J0 + 2ΣJ2k = 1 (A&S 9.1.27, 9.1.46)", () => {
    for (const x of [0.5, 7, 33]) {
      const j = besselJnArray(120, x);
      for (let n = 1; n < 119; n++) expect(Math.abs(j[n - 1] + j[n + 1] - ((2 * n) / x) * j[n])).toBeLessThan(1e-14);
      let sum = j[0];
      for (let n = 2; n <= 120; n += 2) sum += 2 * j[n];
      expect(sum).toBeCloseTo(1, 14);
    }
  });
});
