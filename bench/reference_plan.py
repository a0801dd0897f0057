#!/usr/bin/python3
"""Reference numpy/scipy script: the work of `fragplan plan` on a turbulent cloud, written the
way a practitioner would write it, for the side-by-side benchmark in bench/run.mjs.

What it does (cgs throughout):
  1. a uniform sphere of mass M and radius R in a cubic box of side 2 R padding;
  2. turbulent velocity by FFT: a complex Gaussian vector w per mode of the real-to-complex half
     spectrum, v(k) = k^(-n/2) [zeta w + (1 - 2 zeta) khat (khat . w)] for k_min <= |k| <= k_max
     (integer wavenumbers, cycles per box; Helmholtz projection with solenoidal weight zeta,
     Federrath et al. 2010); the ambient gas at rest, zero net momentum of the cloud, normalised to
     an rms 3D Mach number mass-weighted over the cloud;
  3. lognormal density: a Gaussian random field s(k) = k^(-n_s/2) [sqrt(1 - c^2) z + c (-i khat . w)]
     (c = coupling to the convergence of the flow), standardised over the cloud and scaled to
     sigma_s^2 = ln(1 + b^2 M^2) with mean -sigma_s^2/2 (Padoan, Nordlund & Jones 1997;
     Federrath, Klessen & Schmidt 2008), renormalised so the cloud holds exactly M; an ambient
     medium rho0/contrast outside at T x contrast (pressure balance);
  4. per-cell Jeans number J = dx/lambda_J, lambda_J = sqrt(pi c_s^2/(G rho)) (Truelove et al. 1997),
     optionally with the barotropic T(rho) = T0 [1 + (rho/rho_c)^(gamma-1)];
  5. a threshold hierarchy: connected regions (scipy.ndimage.label, face or corner connectivity)
     above `levels` log-spaced density thresholds from 2 x ambient to the peak; per region mass,
     mean density, velocity dispersion about its own centre-of-mass motion and the Jeans mass
     (sphere of diameter lambda_J, (pi^(5/2)/6) c^3 G^(-3/2) rho^(-1/2), with turbulent support
     c^2 = c_s^2 + sigma_1D^2); regions with at least min_cells cells are kept and linked to the
     region one level down that holds them; unstable = mass > Jeans mass; fragment candidates =
     unstable regions with no unstable descendant;
  6. .npy export (np.save) of density and the three velocity components, float32, C order,
     shape (N, N, N), index (i*N + j)*N + k with i along x, cell-centred, box [-L/2, L/2)^3;
     plus regions.csv and summary.json (timings in seconds per stage).

FFTs are scipy.fft (pocketfft) in single precision with `workers` threads (default: all cores);
the rest is plain vectorised numpy and scipy.ndimage (single-threaded). Not phase-consistent
across resolution (numpy's generator fills the spectrum in array order): that is a fragplan
feature the benchmark does not ask of the script.

Usage: /usr/bin/python3 bench/reference_plan.py --cells 128 --out /tmp/ref --seed 1 [physics options]
"""
import argparse
import json
import os
import sys
import time

import numpy as np
import scipy.fft
from scipy import ndimage

# CODATA 2018 / IAU 2015 values, the same records as src/physics/constants.ts.
G = 6.6743e-8  # cm^3 g^-1 s^-2, CODATA 2018
K_B = 1.380649e-16  # erg/K, CODATA 2018
M_H = 1.6735575e-24  # g, hydrogen atom mass (common practice)
M_SUN = 1.3271244e26 / G  # g, IAU 2015 nominal GM_sun / G
PC = 648000.0 / np.pi * 1.495978707e13  # cm, IAU 2015


def parse_args(argv):
    p = argparse.ArgumentParser(description=__doc__.split('\n')[0])
    p.add_argument('--cells', type=int, default=128, help='cells per side')
    p.add_argument('--out', required=True, help='output folder (created; files in it are replaced)')
    p.add_argument('--seed', type=int, default=1)
    p.add_argument('--mass-msun', type=float, default=1000.0, help='cloud mass, Msun')
    p.add_argument('--radius-pc', type=float, default=1.0, help='cloud radius, pc')
    p.add_argument('--temperature-k', type=float, default=15.0, help='gas temperature, K')
    p.add_argument('--mu', type=float, default=2.33, help='mean molecular weight per free particle')
    p.add_argument('--mach', type=float, default=8.0, help='rms 3D Mach number')
    p.add_argument('--velocity-index', type=float, default=4.0, help='velocity P(k) ~ k^-n')
    p.add_argument('--k-min', type=float, default=2.0, help='smallest driven wavenumber, cycles per box')
    p.add_argument('--k-max', type=float, default=None, help='largest driven wavenumber (default Nyquist)')
    p.add_argument('--solenoidal-weight', type=float, default=1.0, help='Helmholtz weight zeta')
    p.add_argument('--b', type=float, default=None, help='forcing parameter b (default 1 - 2 zeta/3)')
    p.add_argument('--density-index', type=float, default=11.0 / 3.0, help='ln(rho) P(k) ~ k^-n')
    p.add_argument('--density-k-min', type=float, default=1.0)
    p.add_argument('--density-k-max', type=float, default=None)
    p.add_argument('--ambient-turbulence', action='store_true',
                   help='keep the turbulent velocity in the ambient gas too (for spectral checks; fragplan keeps it at rest)')
    p.add_argument('--coupling', type=float, default=0.0, help='ln-density correlation with the flow convergence')
    p.add_argument('--barotropic', action='store_true', help='barotropic T(rho) in the Jeans number')
    p.add_argument('--critical-density', type=float, default=1e-13, help='barotropic stiffening density, g/cm^3')
    p.add_argument('--gamma', type=float, default=1.4, help='barotropic adiabatic index')
    p.add_argument('--contrast', type=float, default=100.0, help='cloud-edge / ambient density')
    p.add_argument('--padding', type=float, default=1.25, help='box side / cloud diameter')
    p.add_argument('--box-pc', type=float, default=None, help='box side, pc (overrides padding)')
    p.add_argument('--levels', type=int, default=25, help='number of density thresholds')
    p.add_argument('--min-cells', type=int, default=27, help='smallest region kept, cells')
    p.add_argument('--connectivity', type=int, choices=(6, 26), default=6)
    p.add_argument('--fft-workers', type=int, default=os.cpu_count() or 1)
    return p.parse_args(argv)


def wavenumbers(n):
    """Signed integer wavenumbers (cycles per box) of the half spectrum, broadcastable float32."""
    kx = np.fft.fftfreq(n, 1.0 / n).astype(np.float32)
    kz = np.fft.rfftfreq(n, 1.0 / n).astype(np.float32)
    return kx[:, None, None], kx[None, :, None], kz[None, None, :]


def spectral_amplitude(n, index, k_min, k_max):
    """sqrt(P(k)) on the half spectrum: k^(-index/2) for k_min <= k <= k_max, zero at k = 0 and Nyquist."""
    kx, ky, kz = wavenumbers(n)
    k = np.sqrt(kx * kx + ky * ky + kz * kz)
    amp = np.zeros_like(k)
    band = (k >= k_min) & (k <= k_max)
    amp[band] = k[band] ** (-index / 2.0)
    half = n // 2
    amp[half, :, :] = 0.0
    amp[:, half, :] = 0.0
    amp[:, :, half] = 0.0
    return amp


def unit_modes(rng, shape):
    """Complex Gaussian modes, each part of unit variance, complex64."""
    z = np.empty(shape, np.complex64)
    z.real = rng.standard_normal(shape, dtype=np.float32)
    z.imag = rng.standard_normal(shape, dtype=np.float32)
    return z


def turbulent_fields(n, rng, args, workers):
    """Raw velocity components and the unit-variance ln-density field s (float32 cubes).

    w: a complex Gaussian vector per mode. Velocity: k^(-n/2) [zeta w + (1 - 2 zeta) khat (khat . w)]
    (Helmholtz projection, Federrath et al. 2010). ln density: k^(-n_s/2) [sqrt(1 - c^2) z + c (-i khat . w)],
    c = coupling: the phase of the convergence of the compressive part of the flow.
    """
    kx, ky, kz = wavenumbers(n)
    k = np.sqrt(kx * kx + ky * ky + kz * kz)
    k[0, 0, 0] = 1.0
    w = [unit_modes(rng, k.shape) for _ in range(3)]
    kdw = kx * w[0]
    kdw += ky * w[1]
    kdw += kz * w[2]
    kdw /= k
    c = args.coupling
    amp = spectral_amplitude(n, args.density_index, args.density_k_min,
                             args.density_k_max if args.density_k_max is not None else n / 2)
    sh = unit_modes(rng, k.shape) * np.float32(np.sqrt(max(0.0, 1.0 - c * c))) if c < 1 else np.zeros(k.shape, np.complex64)
    if c > 0:
        sh += np.complex64(-1j * c) * kdw
    sh *= amp
    del amp
    s = scipy.fft.irfftn(sh, s=(n, n, n), workers=workers)
    del sh
    amp = spectral_amplitude(n, args.velocity_index, args.k_min, args.k_max if args.k_max is not None else n / 2)
    zeta = args.solenoidal_weight
    kdw *= np.float32(1.0 - 2.0 * zeta)
    v = []
    for comp, kc in enumerate((kx, ky, kz)):
        vh = w[comp]
        vh *= np.float32(zeta)
        vh += (kc / k) * kdw
        vh *= amp
        v.append(scipy.fft.irfftn(vh, s=(n, n, n), workers=workers))
        w[comp] = None
        del vh
    return v, s


def main(argv):
    args = parse_args(argv)
    n = args.cells
    os.makedirs(args.out, exist_ok=True)
    timings = {}
    t_start = time.perf_counter()

    mass = args.mass_msun * M_SUN
    radius = args.radius_pc * PC
    box = args.box_pc * PC if args.box_pc is not None else 2.0 * radius * args.padding
    dx = box / n
    dv = dx ** 3
    cs2 = K_B * args.temperature_k / (args.mu * M_H)
    cs2_amb = cs2 * args.contrast  # ambient temperature T x contrast (pressure balance)
    rho0 = mass / (4.0 / 3.0 * np.pi * radius ** 3)
    rho_amb = rho0 / args.contrast
    zeta = args.solenoidal_weight
    b = args.b if args.b is not None else 1.0 + (1.0 / 3.0 - 1.0) * zeta
    sigma_s = np.sqrt(np.log(1.0 + b * b * args.mach ** 2))
    rng = np.random.default_rng(args.seed)
    workers = max(1, args.fft_workers)

    # --- turbulent fields, lognormal density ---------------------------------------------
    t = time.perf_counter()
    x = (-box / 2 + (np.arange(n) + 0.5) * dx).astype(np.float64)
    r2 = (x[:, None, None] ** 2 + x[None, :, None] ** 2) + x[None, None, :] ** 2
    inside = r2 < radius * radius
    del r2
    (vx, vy, vz), s = turbulent_fields(n, rng, args, workers)
    timings['modes_fft'] = time.perf_counter() - t
    t = time.perf_counter()
    s_in = s[inside]
    s_mean, s_std = s_in.mean(dtype=np.float64), s_in.std(dtype=np.float64)
    del s_in
    s -= np.float32(s_mean)
    s *= np.float32(sigma_s / s_std)
    s -= np.float32(sigma_s * sigma_s / 2)
    rho = np.exp(s)
    del s
    rho *= np.float32(rho0)
    cloud_mass = rho[inside].sum(dtype=np.float64) * dv
    rho *= np.float32(mass / cloud_mass)
    outside = ~inside
    rho[outside] = np.float32(rho_amb)
    timings['density'] = time.perf_counter() - t

    # --- velocity: ambient at rest, zero net momentum, Mach number over the cloud ----------
    t = time.perf_counter()
    rho_in = np.where(inside, rho, np.float32(0))
    m_in = rho_in.sum(dtype=np.float64)
    for v in (vx, vy, vz):
        if not args.ambient_turbulence:
            v[outside] = 0
        v -= np.float32(np.sum(rho_in * v, dtype=np.float64) / m_in)
        if not args.ambient_turbulence:
            v[outside] = 0
    e2 = sum(np.sum(rho_in * v * v, dtype=np.float64) for v in (vx, vy, vz))
    scale = args.mach * np.sqrt(cs2) / np.sqrt(e2 / m_in)
    del rho_in
    for v in (vx, vy, vz):
        v *= np.float32(scale)
    timings['velocity'] = time.perf_counter() - t

    # --- per-cell Jeans number J = dx / lambda_J ---------------------------------------
    t = time.perf_counter()
    cs2_cell = np.where(inside, np.float32(cs2), np.float32(cs2_amb))
    if args.barotropic:  # T = T0 [1 + (rho/rho_c)^(gamma - 1)] (Masunaga & Inutsuka 2000; common practice)
        cs2_cell *= 1 + (rho / np.float32(args.critical_density)) ** np.float32(args.gamma - 1)
    jeans = np.float32(dx) * np.sqrt(np.float32(G / np.pi) * rho / cs2_cell)
    del cs2_cell
    j_max = float(jeans.max())
    unresolved = float(rho[jeans > 0.25].sum(dtype=np.float64) * dv / (rho.sum(dtype=np.float64) * dv))
    rho_max_resolved = np.pi * cs2 / (G * (4.0 * dx) ** 2)  # Truelove et al. 1997, N_J = 4
    del jeans
    timings['jeans'] = time.perf_counter() - t

    # --- threshold hierarchy -----------------------------------------------------------
    t = time.perf_counter()
    structure = ndimage.generate_binary_structure(3, 1 if args.connectivity == 6 else 3)
    floor = 2.0 * rho_amb
    peak = float(rho.max())
    thresholds = floor * (peak / floor) ** (np.arange(args.levels) / args.levels)
    rho_f, vx_f, vy_f, vz_f = rho.ravel(), vx.ravel(), vy.ravel(), vz.ravel()
    cols = {k: [] for k in ('level', 'label', 'parent', 'cells', 'mass', 'mean_rho', 'sigma1d', 'mj')}
    nrow = 0
    prev_labels = None
    prev_row_of = None
    for level, thr in enumerate(thresholds):
        mask = rho > np.float32(thr)
        labels, count = ndimage.label(mask, structure=structure)
        idx = np.flatnonzero(mask)
        del mask
        lab = labels.ravel()[idx]
        r = rho_f[idx].astype(np.float64)
        ux, uy, uz = vx_f[idx], vy_f[idx], vz_f[idx]
        ncell = np.bincount(lab, minlength=count + 1)
        m = np.bincount(lab, weights=r, minlength=count + 1)
        px = np.bincount(lab, weights=r * ux, minlength=count + 1)
        py = np.bincount(lab, weights=r * uy, minlength=count + 1)
        pz = np.bincount(lab, weights=r * uz, minlength=count + 1)
        e2 = np.bincount(lab, weights=r * (ux * ux + uy * uy + uz * uz), minlength=count + 1)
        # each region lies inside one region of the level below: its label there, averaged, is exact
        parent_label = None if prev_labels is None else np.bincount(lab, weights=prev_labels.ravel()[idx], minlength=count + 1)
        del idx, lab, r, ux, uy, uz
        prev_labels = labels
        keep = np.flatnonzero(ncell >= args.min_cells)
        keep = keep[keep > 0]
        nk = ncell[keep]
        mk = m[keep]
        sigma1d = np.sqrt(np.maximum(e2[keep] / mk - (px[keep] ** 2 + py[keep] ** 2 + pz[keep] ** 2) / (mk * mk), 0.0) / 3.0)
        mean_rho = mk / nk
        c_eff = np.sqrt(cs2 + sigma1d ** 2)  # turbulent support (common practice)
        mj = (np.pi ** 2.5 / 6.0) * c_eff ** 3 * G ** -1.5 / np.sqrt(mean_rho)  # sphere of diameter lambda_J
        if parent_label is None:
            par = np.full(keep.size, -1, np.int64)
        else:
            par = prev_row_of[np.rint(parent_label[keep] / nk).astype(np.int64)]
        row_of = np.full(count + 1, -1, np.int64)
        row_of[keep] = nrow + np.arange(keep.size)
        nrow += keep.size
        prev_row_of = row_of
        for k, vals in (('level', np.full(keep.size, level)), ('label', keep), ('parent', par), ('cells', nk),
                        ('mass', mk * dv), ('mean_rho', mean_rho), ('sigma1d', sigma1d), ('mj', mj)):
            cols[k].append(vals)
    del prev_labels, labels
    cols = {k: np.concatenate(v) if v else np.zeros(0) for k, v in cols.items()}
    parent = cols['parent'].astype(np.int64)
    mass_r, mj_r, level_r = cols['mass'], cols['mj'], cols['level']
    unstable = mass_r > mj_r
    has_unstable_below = np.zeros(nrow, bool)
    for level in range(args.levels - 1, 0, -1):  # from the top level down: flag parents
        sel = np.flatnonzero((level_r == level) & (unstable | has_unstable_below))
        has_unstable_below[parent[sel]] = True
    candidate = unstable & ~has_unstable_below
    timings['hierarchy'] = time.perf_counter() - t

    # --- export -----------------------------------------------------------------------
    t = time.perf_counter()
    for name, field in (('density', rho), ('velocity_x', vx), ('velocity_y', vy), ('velocity_z', vz)):
        np.save(os.path.join(args.out, name + '.npy'), field)
    with open(os.path.join(args.out, 'regions.csv'), 'w') as f:
        f.write('row,level,label,parent,cells,mass_msun,mean_density_gcc,sigma_1d_kms,jeans_mass_msun,unstable,candidate\n')
        for i in range(nrow):
            f.write(f"{i},{int(level_r[i])},{int(cols['label'][i])},{int(parent[i])},{int(cols['cells'][i])},"
                    f"{mass_r[i] / M_SUN:.6g},{cols['mean_rho'][i]:.6g},{cols['sigma1d'][i] / 1e5:.6g},"
                    f"{mj_r[i] / M_SUN:.6g},{int(unstable[i])},{int(candidate[i])}\n")
    timings['export'] = time.perf_counter() - t
    timings['total'] = time.perf_counter() - t_start

    summary = {
        'cells_per_side': n,
        'box_size_pc': box / PC,
        'cell_size_pc': dx / PC,
        'sigma_s': sigma_s,
        'mass_on_grid_msun': float(rho.sum(dtype=np.float64) * dv / M_SUN),
        'jeans_number_max': j_max,
        'unresolved_mass_fraction': unresolved,
        'max_resolved_density_gcc': rho_max_resolved,
        'levels': args.levels,
        'regions': nrow,
        'unstable_regions': int(unstable.sum()),
        'fragment_candidates': int(candidate.sum()),
        'candidate_masses_msun': sorted((float(x) / M_SUN for x in mass_r[candidate]), reverse=True),
        'fft_workers': workers,
        'timings_s': timings,
    }
    with open(os.path.join(args.out, 'summary.json'), 'w') as f:
        json.dump(summary, f, indent=1)
    print(json.dumps({k: summary[k] for k in ('cells_per_side', 'regions', 'unstable_regions', 'fragment_candidates', 'timings_s')}))


if __name__ == '__main__':
    main(sys.argv[1:])
