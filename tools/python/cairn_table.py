#!/usr/bin/env python3
"""Reader and interpolator for Cairn acceleration tables (pure NumPy, no compiled code of its own).

Loads a table written by ``cairn table`` (NumPy ``.npy`` or CSV) with its JSON sidecar ``DATA.json``, checks the
data file against the SHA-256 in the sidecar, and interpolates it exactly as Cairn's Java ``TableField`` does:

* tricubic Hermite interpolation in each grid cell (Lekien, F. & Marsden, J. (2005) "Tricubic interpolation in
  three dimensions", Int. J. Numer. Meth. Engng 63:455-471, in the tensor-product cubic Hermite form of
  de Boor, C. (1978) A Practical Guide to Splines, ch. IV), with 8 data per node and function (value, 3 first
  derivatives, 3 second cross derivatives, the third cross derivative);
* first derivatives from the tabulated acceleration (for the potential) and gradient tensor (for the acceleration)
  when the table has the tensor, otherwise second-order finite differences of the values;
* spherical tables interpolated in (radius, latitude, longitude) with longitude wrapping round and latitude
  differences continued over a pole to the node at longitude + 180 deg (even longitude count; one-sided otherwise);
* refusal outside the table (``OutsideTableError``): never extrapolation.

Every floating-point operation is done in the same order as in the Java code, so the two agree to rounding of the
few transcendental functions (atan2, sin, cos); see docs/tables.md for the measured agreement.

Conventions: SI units (m, s, m^2/s^2, m/s^2, 1/s^2), model (body-fixed) frame, potential U > 0,
acceleration = grad U (points toward the body).

Caution: results must be verified independently before operational use; mission rules and the responsible
flight-dynamics authority decide.

Use::

    import cairn_table
    t = cairn_table.load("demo-box.npy")          # reads demo-box.npy.json too; checks the SHA-256
    r = t.interpolate([[1500.0, 0.0, 200.0]], gradient=True)
    r["acceleration_m_s2"]                         # shape (n, 3)

Command line: ``python3 cairn_table.py TABLE --points FILE.csv [--gradient]`` prints CSV of the interpolated values.
"""

import hashlib
import json
import math
import os
import sys

import numpy as np

__all__ = ["load", "Table", "TableError", "OutsideTableError"]

# Column positions fixed by the table layout (dev.cairn.tables.TableLayout).
_U = 3
_AX = 4
_LOCATION = 7
_K = 8  # nodal data per function
_F = 4  # functions: U, ax, ay, az
_DEG = 0.017453292519943295  # pi/180, as Java's Math.toRadians multiplies by
_TWO_PI = 2 * math.pi
_CHUNK = 32768  # points per vectorised pass (bounds the scratch memory)


class TableError(ValueError):
    """A table or sidecar that cannot be read or interpolated (message names the file)."""


class OutsideTableError(ValueError):
    """A query point outside the table: the table never extrapolates."""


def _no_duplicates(pairs):
    d = {}
    for k, v in pairs:
        if k in d:
            raise ValueError("duplicate key %r" % k)
        d[k] = v
    return d


def sha256_of(path):
    """SHA-256 (hex) of a file's bytes."""
    h = hashlib.sha256()
    with open(path, "rb") as f:
        for block in iter(lambda: f.read(1 << 20), b""):
            h.update(block)
    return h.hexdigest()


def load(path, verify=True):
    """Reads a table and its sidecar ``path + '.json'``; ``verify`` checks the data against ``data_sha256``."""
    path = os.fspath(path)
    side = path + ".json"
    if not os.path.isfile(path):
        raise TableError("%s: no such file" % path)
    if not os.path.isfile(side):
        raise TableError("%s: no such file (the metadata sidecar of %s)" % (side, os.path.basename(path)))
    try:
        with open(side, "r", encoding="utf-8") as f:
            meta = json.load(f, object_pairs_hook=_no_duplicates)
    except ValueError as e:
        raise TableError("%s: bad JSON: %s" % (side, e))
    if not isinstance(meta, dict):
        raise TableError("%s: not a JSON object" % side)
    if "shard" in meta:
        raise TableError("%s: a shard of a table; merge the shards with 'cairn table-merge' first" % path)
    columns = meta.get("columns")
    shape = meta.get("shape")
    if not (isinstance(columns, list) and columns and all(isinstance(c, str) for c in columns)):
        raise TableError("%s: key 'columns' must be a list of column names" % side)
    if not (isinstance(shape, list) and 2 <= len(shape) <= 4 and all(isinstance(s, int) and s >= 1 for s in shape)):
        raise TableError("%s: key 'shape' must be a list of 2 to 4 positive integers" % side)
    if shape[-1] != len(columns):
        raise TableError("%s: shape %s does not end in the %d columns" % (side, shape, len(columns)))
    fmt = meta.get("data_format") or ("csv" if path.lower().endswith(".csv") else "npy")
    if fmt not in ("npy", "csv"):
        raise TableError("%s: key 'data_format' must be \"npy\" or \"csv\", got %r" % (side, fmt))
    if verify and "data_sha256" in meta:
        if sha256_of(path) != str(meta["data_sha256"]).lower():
            raise TableError("%s: data does not match the SHA-256 in its sidecar (damaged or changed)" % path)
    rows = int(np.prod(shape[:-1]))
    ncol = len(columns)
    if fmt == "npy":
        a = np.load(path, allow_pickle=False)
        if a.dtype.kind != "f" or a.dtype.itemsize != 8:
            raise TableError("%s: dtype %s, expected float64" % (path, a.dtype))
        if list(a.shape) != list(shape):
            raise TableError("%s: shape %s differs from the sidecar's %s" % (path, list(a.shape), shape))
        values = np.ascontiguousarray(a, dtype=np.float64).reshape(rows, ncol)
    else:
        values = _read_csv(path, columns, rows)
    return Table(values, columns, meta, path)


def _read_csv(path, columns, rows):
    values = np.empty((rows, len(columns)))
    with open(path, "r", encoding="utf-8") as f:
        line_no = 0
        header = None
        for line in f:
            line_no += 1
            if not line.startswith("#"):
                header = line.rstrip("\n")
                break
        if header != ",".join(columns):
            raise TableError("%s:%d: header does not match the sidecar's columns" % (path, line_no))
        row = 0
        for line in f:
            line_no += 1
            line = line.rstrip("\n")
            if not line:
                continue
            if row >= rows:
                raise TableError("%s:%d: more rows than the sidecar's shape" % (path, line_no))
            parts = line.split(",")
            if len(parts) != len(columns):
                raise TableError("%s:%d: %d fields, expected %d" % (path, line_no, len(parts), len(columns)))
            try:
                values[row] = [float(p) for p in parts]  # Python's float() is correctly rounded, like Java's
            except ValueError:
                raise TableError("%s:%d: not a number" % (path, line_no))
            row += 1
    if row != rows:
        raise TableError("%s: %d rows, the sidecar's shape says %d" % (path, row, rows))
    return values


class _Axis:
    """One grid axis: node coordinates (m or rad), uniform or listed, periodic or not (TableField.Axis)."""

    def __init__(self, c, uniform, periodic, c0, h):
        self.c = c
        self.n = len(c)
        self.uniform = uniform
        self.periodic = periodic
        self.c0 = c0
        self.h = h

    @staticmethod
    def make_uniform(n, c0, h, periodic):
        return _Axis(c0 + np.arange(n, dtype=np.float64) * h, True, periodic, float(c0), float(h))

    @staticmethod
    def make_list(c):
        c = np.array(c, dtype=np.float64)
        return _Axis(c, False, False, float(c[0]), float("nan"))

    def inside(self, x):
        if self.periodic:
            return ~np.isnan(x)
        return (x >= self.c[0]) & (x <= self.c[-1])

    def locate(self, x):
        """Lower node index, local coordinate in [0, 1] and cell width of each x."""
        n = self.n
        if self.periodic:
            t = (x - self.c0) / self.h
            fl = np.floor(t)
            s = t - fl
            i = (fl.astype(np.int64) % n + n) % n
            width = np.full(x.shape, self.h)
        elif self.uniform:
            t = (x - self.c0) / self.h
            i = np.clip(np.floor(t), 0, n - 2).astype(np.int64)
            s = t - i
            width = np.full(x.shape, self.h)
        else:
            i = np.clip(np.searchsorted(self.c, x, side="right") - 1, 0, n - 2).astype(np.int64)
            width = self.c[i + 1] - self.c[i]
            s = (x - self.c[i]) / width
        return i, s, width


def _numbers(obj, key, count, where, integer=False):
    """A list of finite numbers (count of them, or any count >= 1 when None) from a sidecar object."""
    v = obj.get(key)
    if not isinstance(v, list):
        v = [v]
    ok = len(v) >= 1 and (count is None or len(v) == count) and all(
        isinstance(x, (int, float)) and not isinstance(x, bool) and math.isfinite(x)
        and (not integer or float(x) == int(x)) for x in v)
    if not ok:
        raise TableError("%s: key %r must be %s finite number%s" % (where, key, count or "one or more",
                                                                    "" if count == 1 else "s"))
    return [int(x) for x in v] if integer else [float(x) for x in v]


def _basis(s, h):
    """Cubic Hermite basis and its derivative on one axis (TableField.Evaluator.basis), same operation order."""
    s2 = s * s
    s3 = s2 * s
    b = (2 * s3 - 3 * s2 + 1, (s3 - 2 * s2 + s) * h, 3 * s2 - 2 * s3, (s3 - s2) * h)
    d = ((6 * s2 - 6 * s) / h, 3 * s2 - 4 * s + 1, (6 * s - 6 * s2) / h, 3 * s2 - 2 * s)
    return b, d


class Table:
    """A table in memory with its interpolant. ``values`` has one row per node (C order of the grid shape)."""

    def __init__(self, values, columns, meta, path="table"):
        self.values = values
        self.columns = list(columns)
        self.meta = meta
        self.path = path
        grid = meta.get("grid")
        if not isinstance(grid, dict):
            raise TableError("%s.json: key 'grid' missing" % path)
        self.kind = grid.get("kind")
        for want, at in (("potential_m2_s2", _U), ("ax_m_s2", _AX), ("ay_m_s2", _AX + 1), ("az_m_s2", _AX + 2),
                         ("location", _LOCATION)):
            if len(self.columns) <= at or self.columns[at] != want:
                raise TableError("%s.json: column %d must be %s" % (path, at, want))
        self.has_gradient = "gxx_s2" in self.columns
        self._gcol = self.columns.index("gxx_s2") if self.has_gradient else -1
        self.gm = meta.get("gm_m3_s2")
        where = "%s.json: grid" % path
        if self.kind == "box":
            self.spherical = False
            self.centre = np.zeros(3)
            n = _numbers(grid, "nodes", 3, where, integer=True)
            origin = _numbers(grid, "origin_m", 3, where)
            spacing = _numbers(grid, "spacing_m", 3, where)
            if any(c < 2 for c in n) or any(not h > 0 for h in spacing):
                raise TableError("%s: need at least 2 nodes and a positive spacing per axis" % where)
            self.axes = [_Axis.make_uniform(int(n[a]), origin[a], spacing[a], False) for a in range(3)]
        elif self.kind == "sphere":
            self.spherical = True
            self.centre = np.array(_numbers(grid, "centre_m", 3, where), dtype=np.float64)
            radii = _numbers(grid, "radii_m", None, where)
            if len(radii) < 2:
                raise TableError("%s: a spherical table with one radius cannot be interpolated in 3-D" % path)
            if radii[0] <= 0 or any(not b > a for a, b in zip(radii, radii[1:])):
                raise TableError("%s: radii_m must be positive and strictly ascending" % where)
            lat_step = _numbers(grid, "lat_step_deg", 1, where)[0]
            lon_step = _numbers(grid, "lon_step_deg", 1, where)[0]
            if not (0 < lat_step <= 90 and 0 < lon_step <= 180):
                raise TableError("%s: lat_step_deg and lon_step_deg must divide 180 and 360 into 2 or more steps"
                                 % where)
            nlat = int(np.rint(180 / lat_step)) + 1
            nlon = int(np.rint(360 / lon_step))
            self.axes = [_Axis.make_list(radii), _Axis.make_uniform(nlat, -math.pi / 2, lat_step * _DEG, False),
                         _Axis.make_uniform(nlon, 0.0, lon_step * _DEG, True)]
        elif self.kind == "points":
            raise TableError("%s: a point table is not a grid and cannot be interpolated" % path)
        else:
            raise TableError("%s.json: unknown grid kind %r" % (path, self.kind))
        self.n0, self.n1, self.n2 = (ax.n for ax in self.axes)
        if self.n0 * self.n1 * self.n2 != values.shape[0]:
            raise TableError("%s.json: grid has %d nodes but the data has %d rows"
                             % (path, self.n0 * self.n1 * self.n2, values.shape[0]))
        self._build()

    # ----- nodal data (TableField constructor) -----

    def _node_jacobian(self):
        """d(position)/d(grid coordinate) at every node, as 9 arrays j[0..8] (row-major, column a = dP/du_a)."""
        r = np.repeat(self.axes[0].c, self.n1 * self.n2)
        lat = np.tile(np.repeat(self.axes[1].c, self.n2), self.n0)
        lon = np.tile(self.axes[2].c, self.n0 * self.n1)
        return _sphere_jacobian(r, lat, lon)

    def _chain(self, j, a, gx, gy, gz):
        if not self.spherical:
            return (gx, gy, gz)[a]
        return gx * j[a] + gy * j[3 + a] + gz * j[6 + a]

    def _derive(self, f, a):
        """Second-order finite-difference derivative along grid axis a (TableField.derive/stencil)."""
        ax = self.axes[a]
        g = np.moveaxis(f.reshape(self.n0, self.n1, self.n2), a, -1)
        n = ax.n
        if ax.periodic:
            p = np.arange(n)
            w0 = -0.5 / ax.h
            w1 = 0.5 / ax.h
            d = w0 * g[..., (p + n - 1) % n] + w1 * g[..., (p + 1) % n]
        elif n == 2:
            h = ax.c[1] - ax.c[0]
            one = -1 / h * g[..., 0] + 1 / h * g[..., 1]
            d = np.stack([one, one], axis=-1)
        else:
            c = ax.c
            i0 = np.empty(n, dtype=np.int64)
            w = np.empty((3, n))
            for p in range(n):
                if p == 0:
                    h1 = c[1] - c[0]
                    h2 = c[2] - c[1]
                    i0[p] = 0
                    w[0, p] = -(2 * h1 + h2) / (h1 * (h1 + h2))
                    w[1, p] = (h1 + h2) / (h1 * h2)
                    w[2, p] = -h1 / (h2 * (h1 + h2))
                elif p == n - 1:
                    h1 = c[n - 1] - c[n - 2]
                    h2 = c[n - 2] - c[n - 3]
                    i0[p] = n - 3
                    w[2, p] = (2 * h1 + h2) / (h1 * (h1 + h2))
                    w[1, p] = -(h1 + h2) / (h1 * h2)
                    w[0, p] = h1 / (h2 * (h1 + h2))
                else:
                    h1 = c[p] - c[p - 1]
                    h2 = c[p + 1] - c[p]
                    i0[p] = p - 1
                    w[0, p] = -h2 / (h1 * (h1 + h2))
                    w[1, p] = (h2 - h1) / (h1 * h2)
                    w[2, p] = h1 / (h2 * (h1 + h2))
            d = w[0] * g[..., i0] + w[1] * g[..., i0 + 1] + w[2] * g[..., i0 + 2]
        d = np.moveaxis(d, -1, a).copy()
        if self.spherical and a == 1 and self.n2 % 2 == 0:
            # Over the pole: latitude -90-delta at longitude lon is latitude -90+delta at lon+180 (likewise north).
            f3 = f.reshape(self.n0, self.n1, self.n2)
            k2 = (np.arange(self.n2) + self.n2 // 2) % self.n2
            for p, inner, sgn in ((0, 1, 1.0), (self.n1 - 1, self.n1 - 2, -1.0)):
                w0 = sgn * 0.5 / ax.h
                w1 = -sgn * 0.5 / ax.h
                d[:, p, :] = w0 * f3[:, inner, :] + w1 * f3[:, inner, k2]
        return d.reshape(-1)

    def _build(self):
        v = self.values
        n = v.shape[0]
        self.loc = v[:, _LOCATION].copy()
        f = [v[:, _U + q].copy() for q in range(_F)]
        j = self._node_jacobian() if self.spherical else None
        d1 = [[None] * 3 for _ in range(_F)]
        for a in range(3):
            d1[0][a] = self._chain(j, a, v[:, _AX], v[:, _AX + 1], v[:, _AX + 2])
        if self.has_gradient:
            t = [v[:, self._gcol + m] for m in range(6)]
            rows = ((t[0], t[1], t[2]), (t[1], t[3], t[4]), (t[2], t[4], t[5]))
            for q in range(3):
                for a in range(3):
                    d1[1 + q][a] = self._chain(j, a, *rows[q])
        else:
            for q in range(1, _F):
                for a in range(3):
                    d1[q][a] = self._derive(f[q], a)
        coef = np.empty((n, _F, _K))
        for q in range(_F):
            fu, fv, fw = d1[q]
            if not self.spherical and q == 0 and self.has_gradient:
                # U's second cross derivatives are tabulated exactly (gxy, gxz, gyz).
                fuv = v[:, self._gcol + 1]
                fuw = v[:, self._gcol + 2]
                fvw = v[:, self._gcol + 4]
            else:
                fuv = self._derive(fu, 1)
                fuw = self._derive(fu, 2)
                fvw = self._derive(fv, 2)
            fuvw = self._derive(fuv, 2)
            for k, data in enumerate((f[q], fw, fv, fvw, fu, fuw, fuv, fuvw)):
                coef[:, q, k] = data
        self.coef = coef

    # ----- queries -----

    def _grid_coordinates(self, p):
        x, y, z = p[:, 0], p[:, 1], p[:, 2]
        if not self.spherical:
            return x, y, z
        dx = x - self.centre[0]
        dy = y - self.centre[1]
        dz = z - self.centre[2]
        u = np.sqrt(dx * dx + dy * dy + dz * dz)
        v = np.arctan2(dz, np.sqrt(dx * dx + dy * dy))
        w = np.arctan2(dy, dx)
        w = np.where(w < 0, w + _TWO_PI, w)
        c1 = self.axes[1].c
        v = np.maximum(c1[0], np.minimum(c1[-1], v))  # pole rows may round below +-pi/2
        return u, v, w

    def contains(self, points):
        """Whether each point (m, model frame) lies in the region the table covers (boundary included)."""
        p = np.atleast_2d(np.asarray(points, dtype=np.float64))
        u, v, w = self._grid_coordinates(p)
        return self.axes[0].inside(u) & self.axes[1].inside(v) & self.axes[2].inside(w)

    def interpolate(self, points, gradient=False):
        """Interpolates at points of shape (n, 3), m, model frame.

        Returns a dict: ``potential_m2_s2`` (n,), ``acceleration_m_s2`` (n, 3) (g = grad U), ``location`` (n,)
        (1 inside, 0 outside, 0.5 on the surface, NaN when the cell's corners differ); with ``gradient`` also
        ``gradient_tensor_s2`` (n, 3, 3) (symmetrised derivative of the interpolated acceleration) and
        ``laplacian_s2`` (n,). Raises OutsideTableError when any point lies outside the table.
        """
        p = np.atleast_2d(np.asarray(points, dtype=np.float64))
        if p.ndim != 2 or p.shape[1] != 3:
            raise ValueError("points must have shape (n, 3)")
        out = {"potential_m2_s2": np.empty(len(p)), "acceleration_m_s2": np.empty((len(p), 3)),
               "location": np.empty(len(p))}
        if gradient:
            out["gradient_tensor_s2"] = np.empty((len(p), 3, 3))
            out["laplacian_s2"] = np.empty(len(p))
        for a in range(0, len(p), _CHUNK):
            self._interpolate_chunk(p[a:a + _CHUNK], gradient, out, a)
        return out

    def _interpolate_chunk(self, p, gradient, out, at):
        u, v, w = self._grid_coordinates(p)
        ins = self.axes[0].inside(u) & self.axes[1].inside(v) & self.axes[2].inside(w)
        if not np.all(ins):
            k = int(np.argmin(ins))
            raise OutsideTableError("point (%.6g, %.6g, %.6g) m is outside the table (%s); no extrapolation"
                                    % (p[k, 0], p[k, 1], p[k, 2], self._bounds()))
        i, s0, h0 = self.axes[0].locate(u)
        j, s1, h1 = self.axes[1].locate(v)
        k, s2, h2 = self.axes[2].locate(w)
        k1 = (k + 1) % self.n2 if self.axes[2].periodic else k + 1
        bases = [_basis(s0, h0), _basis(s1, h1), _basis(s2, h2)]
        wv = [b[0] for b in bases]
        wd = [b[1] for b in bases]
        n1, n2 = self.n1, self.n2
        coef = self.coef
        acc = [0.0] * _F
        der = [[0.0] * 3 for _ in range(_F)]
        loc0 = None
        same = None
        for corner in range(8):
            ca = corner >> 2
            cb = (corner >> 1) & 1
            cc = corner & 1
            node = ((i + ca) * n1 + (j + cb)) * n2 + (k if cc == 0 else k1)
            lc = self.loc[node]
            if corner == 0:
                loc0 = lc
                same = np.ones(len(p), dtype=bool)
            else:
                same &= (lc == loc0) | (np.isnan(lc) & np.isnan(loc0))
            cf = coef[node]  # (m, F, K)
            for al in range(2):
                bu = wv[0][2 * ca + al]
                du = wd[0][2 * ca + al]
                for be in range(2):
                    bv = wv[1][2 * cb + be]
                    dv = wd[1][2 * cb + be]
                    for ga in range(2):
                        bw = wv[2][2 * cc + ga]
                        m = 4 * al + 2 * be + ga
                        wgt = bu * bv * bw
                        for q in range(_F):
                            acc[q] = acc[q] + cf[:, q, m] * wgt
                        if gradient:
                            wgu = du * bv * bw
                            wgv = bu * dv * bw
                            wgw = bu * bv * wd[2][2 * cc + ga]
                            for q in range(_F):
                                c = cf[:, q, m]
                                der[q][0] = der[q][0] + c * wgu
                                der[q][1] = der[q][1] + c * wgv
                                der[q][2] = der[q][2] + c * wgw
        n = len(p)
        sl = slice(at, at + n)
        out["potential_m2_s2"][sl] = acc[0]
        for q in range(3):
            out["acceleration_m_s2"][sl, q] = acc[1 + q]
        out["location"][sl] = np.where(same, loc0, np.nan)
        if not gradient:
            return
        t = [None] * 9
        if self.spherical:
            jac = _sphere_jacobian(u, v, w)
            for q in range(3):
                dd = der[1 + q]
                for m in range(3):
                    c1 = jac[3 * m + 1] / (u * u)
                    cpw = np.cos(v)
                    c2 = jac[3 * m + 2] / (u * u * cpw * cpw)
                    t[3 * q + m] = jac[3 * m] * dd[0] + c1 * dd[1] + c2 * dd[2]
        else:
            for q in range(3):
                for m in range(3):
                    t[3 * q + m] = der[1 + q][m]
        gxy = 0.5 * (t[1] + t[3])
        gxz = 0.5 * (t[2] + t[6])
        gyz = 0.5 * (t[5] + t[7])
        g = out["gradient_tensor_s2"]
        g[sl, 0, 0] = t[0]
        g[sl, 1, 1] = t[4]
        g[sl, 2, 2] = t[8]
        g[sl, 0, 1] = g[sl, 1, 0] = gxy
        g[sl, 0, 2] = g[sl, 2, 0] = gxz
        g[sl, 1, 2] = g[sl, 2, 1] = gyz
        out["laplacian_s2"][sl] = t[0] + t[4] + t[8]

    def _bounds(self):
        a = self.axes
        if self.spherical:
            return "radius %r to %r m about (%r, %r, %r)" % (a[0].c[0], a[0].c[-1], *self.centre)
        return "x %r..%r, y %r..%r, z %r..%r m" % (a[0].c[0], a[0].c[-1], a[1].c[0], a[1].c[-1], a[2].c[0],
                                                    a[2].c[-1])


def _sphere_jacobian(r, lat, lon):
    """Columns dP/dr, dP/dlat, dP/dlon of P = r (cos lat cos lon, cos lat sin lon, sin lat), row-major 3x3."""
    cp = np.cos(lat)
    sp = np.sin(lat)
    cl = np.cos(lon)
    sl = np.sin(lon)
    return [cp * cl, -r * sp * cl, -r * cp * sl,
            cp * sl, -r * sp * sl, r * cp * cl,
            sp, r * cp, np.zeros_like(cp)]


def _read_points(path):
    pts = []
    with open(path, "r", encoding="utf-8") as f:
        for no, line in enumerate(f, 1):
            line = line.strip()
            if not line or line.startswith("#"):
                continue
            parts = line.split(",")
            try:
                pts.append([float(x) for x in parts[:3]])
            except ValueError:
                if pts:
                    raise TableError("%s:%d: not a point x,y,z" % (path, no))
                continue  # header line
            if len(parts) < 3:
                raise TableError("%s:%d: not a point x,y,z" % (path, no))
    return np.array(pts, dtype=np.float64).reshape(-1, 3)


def main(argv):
    import argparse
    ap = argparse.ArgumentParser(description="Interpolate a Cairn table at points (SI units, model frame, "
                                 "U > 0, acceleration = grad U). Verify results independently before "
                                 "operational use.")
    ap.add_argument("table")
    ap.add_argument("--points", required=True, help="CSV of points x,y,z in m")
    ap.add_argument("--gradient", action="store_true", help="also the gradient tensor and Laplacian")
    ap.add_argument("--no-verify", action="store_true", help="skip the SHA-256 check of the data file")
    a = ap.parse_args(argv)
    try:
        t = load(a.table, verify=not a.no_verify)
        p = _read_points(a.points)
        r = t.interpolate(p, gradient=a.gradient)
    except (TableError, OutsideTableError, OSError) as e:
        print("cairn_table: error: %s" % e, file=sys.stderr)
        return 2
    cols = ["x_m", "y_m", "z_m", "potential_m2_s2", "ax_m_s2", "ay_m_s2", "az_m_s2", "location"]
    if a.gradient:
        cols += ["gxx_s2", "gxy_s2", "gxz_s2", "gyy_s2", "gyz_s2", "gzz_s2", "laplacian_s2"]
    w = sys.stdout.write
    w(",".join(cols) + "\n")
    for n in range(len(p)):
        row = list(p[n]) + [r["potential_m2_s2"][n]] + list(r["acceleration_m_s2"][n]) + [r["location"][n]]
        if a.gradient:
            g = r["gradient_tensor_s2"][n]
            row += [g[0, 0], g[0, 1], g[0, 2], g[1, 1], g[1, 2], g[2, 2], r["laplacian_s2"][n]]
        w(",".join(repr(float(x)) for x in row) + "\n")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
