"""Natural logarithms with exactly the bits of the editor's JavaScript engine.

Node's V8 computes Math.log and Math.log1p with ports of fdlibm (Sun Microsystems, 1993:
e_log.c and s_log1p.c, as in V8's src/base/ieee754.cc). numpy's log uses other code and differs
from it in the last bit for many inputs (we measured about 1 in 4 on random inputs), which would
make the cluster's term weights differ from the index's. These are the same algorithms in numpy,
operation for operation (IEEE double arithmetic, no fused multiply-add), so the weights agree bit
for bit; test_fdlibm in the repository's tests compares them with node on millions of inputs.
Only positive, finite, normal inputs are needed here (probabilities, counts, n + 1).
"""
import numpy as np

LN2_HI = 6.93147180369123816490e-01
LN2_LO = 1.90821492927058770002e-10
LG1 = 6.666666666666735130e-01
LG2 = 3.999999999940941908e-01
LG3 = 2.857142874366239149e-01
LG4 = 2.222219843214978396e-01
LG5 = 1.818357216161805012e-01
LG6 = 1.531383769920937332e-01
LG7 = 1.479819860511658591e-01


def _split(x):
    bits = x.view(np.uint64)
    hi = (bits >> np.uint64(32)).astype(np.int64)
    lo = bits & np.uint64(0xFFFFFFFF)
    return hi, lo


def _join(hi, lo):
    return ((hi.astype(np.uint64) << np.uint64(32)) | lo).view(np.float64)


def log(x):
    """fdlibm __ieee754_log for an array of positive normal doubles."""
    x = np.ascontiguousarray(x, dtype=np.float64)
    if x.size and not (np.all(x >= 2.2250738585072014e-308) and np.all(np.isfinite(x))):
        raise ValueError("log: only positive, finite, normal inputs are supported")
    hx, lx = _split(x)
    k = (hx >> 20) - 1023
    hx = hx & 0x000FFFFF
    i = (hx + 0x95F64) & 0x100000
    xn = _join(hx | (i ^ 0x3FF00000), lx)  # normalize x or x/2
    k = k + (i >> 20)
    f = xn - 1.0
    dk = k.astype(np.float64)
    out = np.empty_like(x)
    small = (0x000FFFFF & (2 + hx)) < 3  # -2**-20 <= f < 2**-20
    if np.any(small):
        fs = f[small]
        ks = k[small]
        dks = dk[small]
        r = fs * fs * (0.5 - 0.33333333333333333 * fs)
        res = np.where(ks == 0, fs - r, dks * LN2_HI - ((r - dks * LN2_LO) - fs))
        zero = fs == 0.0
        res = np.where(zero, np.where(ks == 0, 0.0, dks * LN2_HI + dks * LN2_LO), res)
        out[small] = res
    big = ~small
    if np.any(big):
        f = f[big]
        k = k[big]
        dk = dk[big]
        h = hx[big]
        s = f / (2.0 + f)
        z = s * s
        ii = h - 0x6147A
        w = z * z
        j = 0x6B851 - h
        t1 = w * (LG2 + w * (LG4 + w * LG6))
        t2 = z * (LG1 + w * (LG3 + w * (LG5 + w * LG7)))
        ii = ii | j
        r = t2 + t1
        hfsq = 0.5 * f * f
        a = np.where(k == 0, f - (hfsq - s * (hfsq + r)), dk * LN2_HI - ((hfsq - (s * (hfsq + r) + dk * LN2_LO)) - f))
        b = np.where(k == 0, f - s * (f - r), dk * LN2_HI - ((s * (f - r) - dk * LN2_LO) - f))
        out[big] = np.where(ii > 0, a, b)
    return out


def log1p(x):
    """fdlibm log1p for an array of doubles ≥ 1 (term counts)."""
    x = np.ascontiguousarray(x, dtype=np.float64)
    if x.size and not (np.all(x >= 1.0) and np.all(x < 9.007199254740992e15)):
        raise ValueError("log1p: only counts from 1 to 2**53 are supported")
    # For x >= 1 (high word >= 0x3ff00000, below 0x43400000) fdlibm takes its general branch
    # with a correction term c.
    u = 1.0 + x
    hu, lu = _split(u)
    k = (hu >> 20) - 1023
    c = np.where(k > 0, 1.0 - (u - x), x - (u - 1.0))
    c = c / u
    hu = hu & 0x000FFFFF
    low = hu < 0x6A09E
    un = np.where(low, _join(hu | 0x3FF00000, lu), _join(hu | 0x3FE00000, lu))
    k = np.where(low, k, k + 1)
    hu = np.where(low, hu, (0x00100000 - hu) >> 2)
    f = un - 1.0
    hfsq = 0.5 * f * f
    dk = k.astype(np.float64)
    out = np.empty_like(x)
    zero_hu = hu == 0
    if np.any(zero_hu):
        fz, dz, cz = f[zero_hu], dk[zero_hu], c[zero_hu]
        r = hfsq[zero_hu] * (1.0 - 0.66666666666666666 * fz)
        # k > 0 always here (x >= 1)
        res = dz * LN2_HI - ((r - (dz * LN2_LO + cz)) - fz)
        res = np.where(fz == 0.0, dz * LN2_HI + (cz + dz * LN2_LO), res)
        out[zero_hu] = res
    rest = ~zero_hu
    if np.any(rest):
        f, dk, c, hf = f[rest], dk[rest], c[rest], hfsq[rest]
        s = f / (2.0 + f)
        z = s * s
        r = z * (LG1 + z * (LG2 + z * (LG3 + z * (LG4 + z * (LG5 + z * (LG6 + z * LG7))))))
        out[rest] = dk * LN2_HI - ((hf - (s * (hf + r) + (dk * LN2_LO + c))) - f)
    return out
