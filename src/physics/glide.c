/*
 * glide.c - sideways glide of falling plates (sources and status in
 * include/plumb/glide.h).
 */
#include <math.h>

#include "plumb/constants.h"
#include "plumb/glide.h"

double plumb_glide_ratio_max(plumb_glide_mode mode)
{
    switch (mode) {
    case PLUMB_GLIDE_TUMBLE: return PLUMB_GLIDE_TUMBLE_RATIO;
    case PLUMB_GLIDE_FLUTTER: return PLUMB_GLIDE_FLUTTER_RATIO;
    case PLUMB_GLIDE_OFF:
    default: return 0.0;
    }
}

double plumb_glide_istar(double mass_kg, double a_m, double b_m, double rho_f_kg_m3)
{
    double l = a_m < b_m ? a_m : b_m;
    return mass_kg / (a_m * b_m) / (rho_f_kg_m3 * l);
}

plumb_glide_mode plumb_glide_regime(double istar)
{
    return istar >= PLUMB_GLIDE_TUMBLE_ISTAR ? PLUMB_GLIDE_TUMBLE : PLUMB_GLIDE_FLUTTER;
}

void plumb_glide_offset(plumb_glide_mode mode, double height_m, double u_ratio, double u_dir,
                        double out_m[2])
{
    double d = plumb_glide_ratio_max(mode) * u_ratio * height_m;
    double az = 2.0 * PLUMB_PI * u_dir;
    out_m[0] = d * sin(az);
    out_m[1] = d * cos(az);
}

const char *plumb_glide_mode_name(plumb_glide_mode mode)
{
    switch (mode) {
    case PLUMB_GLIDE_TUMBLE: return "tumble";
    case PLUMB_GLIDE_FLUTTER: return "flutter";
    case PLUMB_GLIDE_OFF:
    default: return "off";
    }
}
