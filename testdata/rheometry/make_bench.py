"""Invented example readings for 'flowregime reduce' (README "At the bench").

Every file is made from a chosen model by the forward relations, with
multiplicative noise of 1.5 % (fixed seed), then rounded as an instrument
would print it. Python 3 standard library only; CI does not run this.

  snail_couette.csv    pedal mucus of a garden snail, Herschel–Bulkley
                       tau_y 8 Pa, K 3 Pa·s^n, n 0.45; bob 12.5 mm in a
                       13.6 mm cup, bob length 37.5 mm; speed in rpm
  slug_coneplate.csv   slug trail mucus, power law K 1.2, n 0.35;
                       cone 25 mm radius, 2 deg
  egg_jelly_plates.csv frog egg jelly, power law K 0.8, n 0.55;
                       plates 20 mm radius, 1.0 mm gap
  broth_capillary.csv  algal culture broth, power law K 0.05, n 0.7;
                       tube 0.8 mm diameter, lengths 10, 40 and 80 mm, end
                       correction 3 radii; noise 0.5 % on pressure
  syrup_ball.csv       sugar syrup for a settling tank, Newtonian 0.85 Pa·s,
                       density 1330 kg/m3; 2.0 mm steel ball (7850 kg/m3)
                       in a 30 mm tube, timed over 100 mm
"""
import math, random

rng = random.Random(17)
def noisy(v, sd=0.015): return v * math.exp(sd * rng.gauss(0, 1))
def simpson(f, a, b, n=400):
    h = (b - a) / n
    s = f(a) + f(b) + sum((4 if i % 2 else 2) * f(a + i * h) for i in range(1, n))
    return s * h / 3
def logspace(lo, hi, n): return [lo * (hi / lo) ** (i / (n - 1)) for i in range(n)]

def hb_rate(s, ty, K, n): return 0.0 if s <= ty else ((s - ty) / K) ** (1 / n)

# concentric cylinder, HB
Rb, Rc, h = 0.0125, 0.0136, 0.0375
ty, K, n = 8.0, 3.0, 0.45
with open("snail_couette.csv", "w") as f:
    f.write("speed (rpm),torque (mN·m)\n")
    for g in logspace(0.5, 200, 14):
        sb = ty + K * g ** n
        om = 0.5 * simpson(lambda s: hb_rate(s, ty, K, n) / s, sb * (Rb / Rc) ** 2, sb)
        M = noisy(sb * 2 * math.pi * h * Rb ** 2)
        f.write("%.4g,%.4g\n" % (om * 60 / (2 * math.pi), M * 1e3))

# cone and plate, power law
R, th = 0.025, math.radians(2.0)
with open("slug_coneplate.csv", "w") as f:
    f.write("speed (rad/s),torque (µN·m)\n")
    for g in logspace(0.1, 100, 10):
        M = noisy(1.2 * g ** 0.35 * 2 * math.pi * R ** 3 / 3)
        f.write("%.4g,%.4g\n" % (g * math.tan(th), M * 1e6))

# parallel plates, power law: M = 2 pi R^3 K gR^n/(n+3)
R, gap = 0.020, 0.0010
with open("egg_jelly_plates.csv", "w") as f:
    f.write("speed (rpm),torque (µN·m)\n")
    for g in logspace(0.3, 300, 12):
        M = noisy(2 * math.pi * R ** 3 * 0.8 * g ** 0.55 / 3.55)
        f.write("%.4g,%.4g\n" % (g * gap / R * 60 / (2 * math.pi), M * 1e6))

# capillary with two lengths (Bagley), power law
D, e, Kc, nc = 0.0008, 3.0, 0.05, 0.7
with open("broth_capillary.csv", "w") as f:
    f.write("flow rate (mL/min),pressure drop (kPa),tube length (mm)\n")
    for tw in logspace(0.5, 20, 9):
        Q = math.pi * (D / 2) ** 3 * nc / (3 * nc + 1) * (tw / Kc) ** (1 / nc)
        for L in (0.010, 0.040, 0.080):
            dp = noisy(2 * tw * (L / (D / 2) + e), 0.005)
            f.write("%.6g,%.4g,%g\n" % (Q * 6e7, dp / 1e3, L * 1e3))

# falling ball, Newtonian, Haberman & Sayre wall factor
d, Dt, rs, rf, mu, fall = 0.0020, 0.030, 7850.0, 1330.0, 0.85, 0.100
lam = d / Dt
K = (1 - 0.75857 * lam ** 5) / (1 - 2.1050 * lam + 2.0865 * lam ** 3 - 1.7068 * lam ** 5 + 0.72603 * lam ** 6)
v = (rs - rf) * 9.80665 * d * d / (18 * mu * K)
with open("syrup_ball.csv", "w") as f:
    f.write("fall time (s)\n")
    for i in range(6):
        f.write("%.3f\n" % noisy(fall / v))
