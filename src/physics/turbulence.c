/*
 * turbulence.c - Dryden and von Karman gusts below 1000 ft as random
 * Fourier modes (model, sources and status in include/plumb/turbulence.h).
 */
#include <math.h>

#include "plumb/constants.h"
#include "plumb/turbulence.h"
#include "physics/physics.h"

/* MIL-F-8785C low-altitude coefficients: 0.177 + 0.000823 h (h in ft). */
#define MIL_A 0.177
#define MIL_B 0.000823

/* Rejection sampling of the unit spectra: proposal density proportional to
 * (1 + b x)^(-5/3), whose tail is as heavy as von Karman's; M bounds
 * f(x) (1 + b x)^(5/3) over x >= 0 (computed on a dense grid: 1.627,
 * 3.380, 1.782, 3.808), with a margin. */
static const double bound_m[2][2] = {{1.64, 3.40}, {1.80, 3.83}};
enum { MAX_TRIES = 10000 };

/* 8-point Gauss-Legendre nodes and weights on [-1, 1] (Abramowitz & Stegun, Table 25.4). */
static const double gl_x[4] = {0.1834346424956498, 0.5255324099163290, 0.7966664774136267,
                               0.9602898564975363};
static const double gl_w[4] = {0.3626837833783620, 0.3137066278286263, 0.2223810344533745,
                               0.1012285362903763};

const char *plumb_turbulence_model_name(plumb_turbulence_model m)
{
    switch (m) {
    case PLUMB_TURB_DRYDEN: return "dryden";
    case PLUMB_TURB_VON_KARMAN: return "von-karman";
    case PLUMB_TURB_NONE:
    default: return "none";
    }
}

static double clamp_ft(double z_m)
{
    double h = z_m / PLUMB_FT_M;
    return h < PLUMB_TURB_H_MIN_FT ? PLUMB_TURB_H_MIN_FT
           : h > PLUMB_TURB_H_MAX_FT ? PLUMB_TURB_H_MAX_FT : h;
}

double plumb_turbulence_sigma(plumb_turbulence_axis axis, double w20_m_s, double z_m)
{
    double sw = 0.1 * w20_m_s;
    if (axis == PLUMB_TURB_W)
        return sw;
    return sw / pow(MIL_A + MIL_B * clamp_ft(z_m), 0.4);
}

/* L in ft at h in ft (already clamped). */
static double length_ft(plumb_turbulence_axis axis, double h)
{
    return axis == PLUMB_TURB_W ? h : h / pow(MIL_A + MIL_B * h, 1.2);
}

double plumb_turbulence_length(plumb_turbulence_axis axis, double z_m)
{
    return length_ft(axis, clamp_ft(z_m)) * PLUMB_FT_M;
}

/* int_{10}^{h} dh / L(h) for 10 <= h <= 1000 ft: in x = ln h the integrand
 * h / L is 1 (w) or (a + b h)^1.2 (u, v), smooth, by 8-point Gauss-Legendre
 * (its error is far below 1e-9 over this range). */
static double zeta_core(plumb_turbulence_axis axis, double h)
{
    double x0 = log(PLUMB_TURB_H_MIN_FT), x1 = log(h);
    if (axis == PLUMB_TURB_W)
        return x1 - x0;
    double c = 0.5 * (x0 + x1), r = 0.5 * (x1 - x0), s = 0.0;
    for (int i = 0; i < 4; i++) {
        double ha = exp(c + r * gl_x[i]), hb = exp(c - r * gl_x[i]);
        s += gl_w[i] * (pow(MIL_A + MIL_B * ha, 1.2) + pow(MIL_A + MIL_B * hb, 1.2));
    }
    return r * s;
}

double plumb_turbulence_zeta(plumb_turbulence_axis axis, double z_m)
{
    double h = z_m / PLUMB_FT_M;
    if (h <= PLUMB_TURB_H_MIN_FT)
        return (h - PLUMB_TURB_H_MIN_FT) / length_ft(axis, PLUMB_TURB_H_MIN_FT);
    if (h >= PLUMB_TURB_H_MAX_FT)
        return zeta_core(axis, PLUMB_TURB_H_MAX_FT) +
               (h - PLUMB_TURB_H_MAX_FT) / length_ft(axis, PLUMB_TURB_H_MAX_FT);
    return zeta_core(axis, h);
}

double plumb_turbulence_unit_spectrum(plumb_turbulence_model m, plumb_turbulence_axis axis,
                                      double k)
{
    if (!(k >= 0.0))
        return 0.0;
    if (m == PLUMB_TURB_DRYDEN) {
        double q = k * k;
        return axis == PLUMB_TURB_U ? 2.0 / PLUMB_PI / (1.0 + q)
                                    : (1.0 + 3.0 * q) / (PLUMB_PI * (1.0 + q) * (1.0 + q));
    }
    if (m == PLUMB_TURB_VON_KARMAN) {
        double q = PLUMB_TURB_VK_A * k;
        q *= q;
        return axis == PLUMB_TURB_U ? 2.0 / PLUMB_PI / pow(1.0 + q, 5.0 / 6.0)
                                    : (1.0 + 8.0 / 3.0 * q) / (PLUMB_PI * pow(1.0 + q, 11.0 / 6.0));
    }
    return 0.0;
}

static double draw_kappa(plumb_turbulence_model m, plumb_turbulence_axis axis,
                         double (*uniform)(void *), void *stream)
{
    int vk = m == PLUMB_TURB_VON_KARMAN, tr = axis != PLUMB_TURB_U;
    double b = vk ? PLUMB_TURB_VK_A : 1.0, M = bound_m[vk][tr];
    double gmax = 1.0 - pow(1.0 + b * PLUMB_TURB_KAPPA_MAX, -2.0 / 3.0);
    double x = 0.0;
    for (int i = 0; i < MAX_TRIES; i++) {
        double u = uniform(stream) * gmax;
        x = (pow(1.0 - u, -1.5) - 1.0) / b;
        double ratio = plumb_turbulence_unit_spectrum(m, axis, x) * pow(1.0 + b * x, 5.0 / 3.0);
        if (uniform(stream) * M * 2.0 / PLUMB_PI < ratio * (tr ? 2.0 : 1.0))
            return x;
    }
    return x;
}

/* Chebyshev series of zeta_u over x = ln h in [ln 10, ln 1000] ft, from
 * its values at the Chebyshev nodes (Numerical Recipes' chebft form):
 * zeta(x) = sum' c_k T_k(t), t = (2x - x0 - x1) / (x1 - x0). */
static void zeta_fit(double c[PLUMB_TURB_CHEB])
{
    double x0 = log(PLUMB_TURB_H_MIN_FT), x1 = log(PLUMB_TURB_H_MAX_FT), f[PLUMB_TURB_CHEB];
    int n = PLUMB_TURB_CHEB;
    for (int k = 0; k < n; k++) {
        double t = cos(PLUMB_PI * (k + 0.5) / n);
        f[k] = zeta_core(PLUMB_TURB_U, exp(0.5 * (x0 + x1) + 0.5 * (x1 - x0) * t));
    }
    for (int j = 0; j < n; j++) {
        double s = 0.0;
        for (int k = 0; k < n; k++)
            s += f[k] * cos(PLUMB_PI * j * (k + 0.5) / n);
        c[j] = 2.0 * s / n;
    }
}

/* zeta_u at h (ft) from the series, Clenshaw's recurrence; outside 10..1000
 * ft the linear continuation of plumb_turbulence_zeta. */
static double zeta_u_fast(const double c[PLUMB_TURB_CHEB], double z_m)
{
    double h = z_m / PLUMB_FT_M;
    if (h <= PLUMB_TURB_H_MIN_FT || h >= PLUMB_TURB_H_MAX_FT)
        return plumb_turbulence_zeta(PLUMB_TURB_U, z_m);
    double x0 = log(PLUMB_TURB_H_MIN_FT), x1 = log(PLUMB_TURB_H_MAX_FT);
    double t = (2.0 * log(h) - x0 - x1) / (x1 - x0), t2 = 2.0 * t, d = 0.0, dd = 0.0;
    for (int j = PLUMB_TURB_CHEB - 1; j >= 1; j--) {
        double sv = d;
        d = t2 * d - dd + c[j];
        dd = sv;
    }
    return t * d - dd + 0.5 * c[0];
}

double plumbp_turbulence_zeta_fast(const plumb_turbulence_spec *t, double z_m)
{
    return zeta_u_fast(t->zeta_cheb, z_m);
}

void plumb_turbulence_realise(plumb_turbulence_spec *t, size_t n, double w20_m_s, double z_ref_m,
                              double (*uniform)(void *), void *stream)
{
    if (n > PLUMB_TURB_MODES)
        n = PLUMB_TURB_MODES;
    t->n_modes = n;
    zeta_fit(t->zeta_cheb);
    for (int a = 0; a < 3; a++) {
        plumb_turbulence_axis ax = (plumb_turbulence_axis)a;
        double rate = plumb_turbulence_sigma(ax, w20_m_s, z_ref_m) /
                      plumb_turbulence_length(ax, z_ref_m);
        for (size_t i = 0; i < n; i++) {
            t->kappa[a][i] = draw_kappa(t->model, ax, uniform, stream);
            t->phase[a][i] = 2.0 * PLUMB_PI * uniform(stream);
            /* Box-Muller normal deviate */
            double u1 = 1.0 - uniform(stream), u2 = uniform(stream);
            double g = sqrt(-2.0 * log(u1)) * cos(2.0 * PLUMB_PI * u2);
            t->omega_s[a][i] = g * rate * t->kappa[a][i];
        }
    }
}

void plumb_turbulence_at(const plumb_turbulence_spec *t, double w20_m_s, double z_m, double t_s,
                         double g_m_s[3])
{
    g_m_s[0] = g_m_s[1] = g_m_s[2] = 0.0;
    if (t->model == PLUMB_TURB_NONE || t->n_modes == 0 || !(w20_m_s > 0.0))
        return;
    double amp = sqrt(2.0 / (double)t->n_modes);
    double zeta_uv = zeta_u_fast(t->zeta_cheb, z_m);
    double zeta_w = plumb_turbulence_zeta(PLUMB_TURB_W, z_m);
    /* u and v share one sigma (and its pow()), taken once */
    double sigma_uv = plumb_turbulence_sigma(PLUMB_TURB_U, w20_m_s, z_m);
    double sigma_w = plumb_turbulence_sigma(PLUMB_TURB_W, w20_m_s, z_m);
    for (int a = 0; a < 3; a++) {
        double zeta = a == PLUMB_TURB_W ? zeta_w : zeta_uv, s = 0.0;
        for (size_t i = 0; i < t->n_modes; i++)
            s += cos(t->kappa[a][i] * zeta + t->omega_s[a][i] * t_s + t->phase[a][i]);
        g_m_s[a] = (a == PLUMB_TURB_W ? sigma_w : sigma_uv) * amp * s;
    }
}
