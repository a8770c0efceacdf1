/*
 * downwash.c - the rotor wake below a hovering multirotor (model, sources
 * and status in include/plumb/downwash.h).
 */
#include <math.h>
#include <string.h>

#include "plumb/constants.h"
#include "plumb/downwash.h"

#define LN2 0.69314718055994530942

void plumb_downwash_init(const plumb_downwash_spec *spec, double rho_kg_m3, double g_m_s2,
                         const double release_m[3], const double aircraft_v_m_s[2],
                         const double v_rel_m_s[2], plumb_downwash *out)
{
    memset(out, 0, sizeof *out);
    if (!(spec->aircraft_mass_kg > 0.0) || !(spec->disk_area_m2 > 0.0) || !(rho_kg_m3 > 0.0))
        return;
    double A = spec->disk_area_m2;
    out->on = 1;
    out->thrust_n = spec->aircraft_mass_kg * g_m_s2;
    out->v_hover_m_s = sqrt(out->thrust_n / (2.0 * rho_kg_m3 * A));
    double V = hypot(v_rel_m_s[0], v_rel_m_s[1]);
    double vh2 = out->v_hover_m_s * out->v_hover_m_s;
    /* Glauert, disk edge-on: v_i^2 = (-V^2 + sqrt(V^4 + 4 v_h^4)) / 2, written
     * without cancellation: 2 v_h^4 / (V^2 + sqrt(V^4 + 4 v_h^4)) */
    out->v_i_m_s = sqrt(2.0 * vh2 * vh2 / (V * V + sqrt(V * V * V * V + 4.0 * vh2 * vh2)));
    out->radius_m = sqrt(A / PLUMB_PI);
    out->wake_d_m = sqrt(2.0 * A / PLUMB_PI);
    out->skew_rad = atan2(V, out->v_i_m_s);
    if (V > 0.0) {
        out->dir[0] = v_rel_m_s[0] / V;
        out->dir[1] = v_rel_m_s[1] / V;
    }
    memcpy(out->origin_m, release_m, 3 * sizeof *release_m);
    out->aircraft_v_m_s[0] = aircraft_v_m_s[0];
    out->aircraft_v_m_s[1] = aircraft_v_m_s[1];
}

/* Centreline speed at distance s along the wake axis (negative above the
 * rotor). */
static double centreline(const plumb_downwash *dw, double s)
{
    double R = dw->radius_m, vi = dw->v_i_m_s;
    double un = vi * (1.0 + s / sqrt(s * s + R * R));
    if (!(s > 0.0))
        return un;
    double uj = PLUMB_DOWNWASH_JET_B * 2.0 * vi * dw->wake_d_m / s;
    double a = un * un, b = uj * uj;
    if (!(a > 0.0))
        return 0.0;
    /* (un^-4 + uj^-4)^(-1/4) = un / (1 + (un/uj)^4)^(1/4) */
    double q = a / b;
    return un / sqrt(sqrt(1.0 + q * q));
}

double plumb_downwash_centreline(const plumb_downwash *dw, double d_m)
{
    return dw->on ? centreline(dw, d_m) : 0.0;
}

void plumb_downwash_at(const plumb_downwash *dw, double t_s, const double p_m[3],
                       double w_m_s[3])
{
    w_m_s[0] = w_m_s[1] = w_m_s[2] = 0.0;
    if (!dw->on)
        return;
    /* rotor hub now; the payload relative to it */
    double rx = p_m[0] - (dw->origin_m[0] + dw->aircraft_v_m_s[0] * t_s);
    double ry = p_m[1] - (dw->origin_m[1] + dw->aircraft_v_m_s[1] * t_s);
    double rz = p_m[2] - dw->origin_m[2];
    /* wake axis: a = (sin chi dir, -cos chi) */
    double sc = sin(dw->skew_rad), cc = cos(dw->skew_rad);
    double ax = sc * dw->dir[0], ay = sc * dw->dir[1], az = -cc;
    double s = rx * ax + ry * ay + rz * az; /* distance along the axis */
    double px = rx - s * ax, py = ry - s * ay, pz = rz - s * az;
    double r2 = px * px + py * py + pz * pz;
    double sp = s > 0.0 ? PLUMB_DOWNWASH_JET_S * s : 0.0;
    double Rw = dw->radius_m / sqrt(2.0);
    double b2 = Rw * Rw + sp * sp;
    double u = centreline(dw, s) * exp(-LN2 * r2 / b2);
    w_m_s[0] = u * ax;
    w_m_s[1] = u * ay;
    w_m_s[2] = u * az;
}
