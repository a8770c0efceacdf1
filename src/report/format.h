/*
 * format.h - the shared number and unit formatter of the report writers
 * (format.c): figures in fixed, scientific, trimmed and %g forms, the
 * quantities of the text and CSV reports in the chosen units (SI or US
 * customary), and the finiteness checks made before anything is written.
 * Internal to the report layer.
 */
#ifndef PLUMB_REPORT_FORMAT_H
#define PLUMB_REPORT_FORMAT_H

#include "plumb/constants.h"
#include "plumb/dispersion.h"
#include "plumb/error.h"
#include "plumb/report.h"
#include "report/textout.h"

/* International inch, m: 1/12 of the foot, 0.0254 m exactly (1959
 * agreement; NIST SP 811, 2008, Appendix B.8). */
#define INCH_M 0.0254
/* Statute mile per hour, m/s: 5280 international feet per 3600 s. */
#define MPH_M_S (5280.0 * PLUMB_FT_M / 3600.0)
/* Knot, m/s: international nautical mile 1852 m (1929) per 3600 s. */
#define KNOT_M_S (1852.0 / 3600.0)
/* Kilometre per hour, m/s. */
#define KMH_M_S (1000.0 / 3600.0)
/* Pound-force, N: the avoirdupois pound under standard gravity. */
#define LBF_N (PLUMB_LB_KG * PLUMB_G0_M_S2)
/* Conventional inch of mercury, Pa (NIST SP 811, 2008, Appendix B.8). */
#define INHG_PA 3386.389
/* Pascals per hectopascal. */
#define HPA_PA 100.0
/* Kelvin to degree Celsius offset, K (constants.h). */
#define CELSIUS_ZERO_K PLUMB_CELSIUS_ZERO_K
/* Fahrenheit scale: T(degF) = T(K) x 9/5 - 459.67 (NIST SP 811, B.8). */
#define FAHRENHEIT_PER_K 1.8
#define FAHRENHEIT_ZERO_OFFSET 459.67

/* Degrees per radian, 180 / pi (C11 has no M_PI). */
#define DEG_PER_RAD 57.29577951308232087680


/* Horizontal distance below which the text report says the object lands
 * below its release point: half the last digit the text shows (1 cm). */
#define DRIFT_SHOWN_M 0.005

/* Significant digits of figures in the text report, and of numbers in CSV. */
#define INPUT_SIG 6
#define RATIO_SIG 3
/* Width the text report wraps warnings and cautions at. */
/* Most rows of a wind table the text report lists. */
#define WIND_ROWS_SHOWN 6
/* Compass points used to name a bearing. */

/* A finiteness check in progress: the first non-finite figure raises
 * PLUMB_ENUMERIC naming it (and the item, when there is one). */
typedef struct finite_check {
    plumb_diag *diag;
    const char *item;      /* item name for the message */
    plumb_status status;
} finite_check;

void plumbp_need_finite(finite_check *fc, const char *what, double x);
plumb_status plumbp_check_item(const plumb_item_report *it, plumb_diag *diag);
char *plumbp_fixed(writer *w, double x, int dec);
const char *plumbp_sci(writer *w, double x, int sig);
const char *plumbp_trimmed(writer *w, double x, int dec);
/* x with at most `sig` significant digits and `dec` decimals; trailing
 * zeros dropped when `strip`. */
const char *plumbp_trim_to(writer *w, double x, int sig, int dec, int strip);
int plumbp_shows_zero(const char *s);
const char *plumbp_t_len(writer *w, double m);
/* A fall's drift, one formatter for every report that gives it: "none"
 * below DRIFT_SHOWN_M (it lands below its release point), else the length
 * as plumbp_t_len gives it (TEXT_SIG figures), with its unit, or the
 * number alone when unit is 0 (a table's column, under its unit). */
const char *plumbp_t_drift(writer *w, double m, int unit);
/* A length of a zone's spread of samples (an ellipse's semi-axes, a
 * radius): TEXT_SIG figures but no digit below a millimetre (a thousandth
 * of a foot), which a spread is not known finer than: a semi-axis of
 * (nearly) nothing reads "0 m", not "0.000002872 ft". The text report's
 * zone and the sheet share it. */
const char *plumbp_t_zone_len(writer *w, double m);
/* A zone's energy percentile, "59.43 J (43.84 ft·lbf)": TEXT_SIG figures,
 * no digit below a millijoule; and a zone's share or probability p (a
 * fraction) as a percent, "37.2 %", no digit below a hundredth of a
 * percent, a small non-zero share kept at two figures. The text report's
 * zone and the sheet share them. */
const char *plumbp_t_zone_energy(writer *w, double j);
const char *plumbp_t_pct(writer *w, double p);
const char *plumbp_t_size(writer *w, double m);
const char *plumbp_t_offset(writer *w, double x, const char *pos, const char *neg);
const char *plumbp_t_speed(writer *w, double v);
const char *plumbp_t_wind(writer *w, double v);
const char *plumbp_t_energy(writer *w, double j);
double plumbp_round_safe(double x, int sig, int round_down);
double plumbp_round_safe_at(double x, int dec, int round_down);
const char *plumbp_t_round(writer *w, const char *(*t)(writer *, double), double x, int dir);
const char *plumbp_t_clear(writer *w, const char *(*t)(writer *, double), double x);
const char *plumbp_t_limit(writer *w, const char *(*t)(writer *, double), double x);
const char *plumbp_t_limit_energy(writer *w, double j);
/* A figure beside the limit it is judged against never reads as the
 * other side of it: the limit is printed rounded down (the strict side,
 * plumbp_t_limit) and the figure to the nearest, so at a limit the two
 * may print the wrong way round ("78.64 J" within a limit of "78.63 J").
 * These give the significant figures, at least `base`, at which both
 * read as the verdict says, in J and ft·lbf alike (README.md
 * "Criteria"). plumbp_energy_sig: the figures of the energy judged by
 * v[0..n) so that each limit at as many agrees with it;
 * plumbp_limit_sig: those of v's limit beside the energy shown at esig
 * (at most esig when esig came from plumbp_energy_sig); plumbp_ratio_sig:
 * those of v's ratio, read against 1. Can't fail. */
int plumbp_energy_sig(const plumb_verdict *v, size_t n, int base);
int plumbp_limit_sig(const plumb_verdict *v, int esig, int base);
int plumbp_ratio_sig(const plumb_verdict *v, int base);
/* v's ratio at plumbp_ratio_sig(v, RATIO_SIG) figures: "1.00" when that
 * reads as v's verdict, "0.99992" or "1.0001" when it would not. */
const char *plumbp_t_ratio(writer *w, const plumb_verdict *v);
/* Energy (plumbp_t_energy) and a limit (plumbp_t_limit_energy) at sig
 * significant figures. */
const char *plumbp_t_energy_at(writer *w, double j, int sig);
const char *plumbp_t_limit_energy_at(writer *w, double j, int sig);
const char *plumbp_csv_limit(writer *w, double j);
/* The same to sig figures (plumbp_limit_sig against the CSV's energies). */
const char *plumbp_csv_limit_at(writer *w, double j, int sig);
/* The figures criterion k's limit is given with beside a report's items:
 * as many as the item that needs the most to show its side of it
 * (plumbp_limit_sig against its energy at plumbp_energy_sig(..., base)),
 * at least base. */
int plumbp_report_limit_sig(const plumb_fall_report *rep, size_t k, int base);
const char *plumbp_t_mass(writer *w, double kg);
const char *plumbp_t_area(writer *w, double m2);
/* A landing region's area, a keep-clear figure (rounded up); one of (near)
 * zero area reads "under 0.01 m²" (ft² in US units), which is as safe and
 * reads as a person on site expects, not as a row of zeros. */
const char *plumbp_t_region_area(writer *w, double m2);
const char *plumbp_t_force(writer *w, double n);
const char *plumbp_t_temp(writer *w, double k);
const char *plumbp_t_press(writer *w, double pa);
const char *plumbp_t_gravity(writer *w, double g);
const char *plumbp_t_density(writer *w, double rho);
const char *plumbp_si_bracket(writer *w, double x, const char *unit);
const char *plumbp_t_bearing(writer *w, double deg);
const char *plumbp_t_small(writer *w, double m);
const char *plumbp_t_lapse(writer *w, double k_m);
const char *plumbp_t_angle(writer *w, double deg);
/* A warning sentence (plumb/judge.h, plumb/dispersion.h) with each
 * quantity's mark (PLUMBP_Q_*, core/internal.h) put in the writer's units,
 * the one place a warning's figures are formatted; numbers stay joined to
 * their units for wrapping. A mark that cannot be read shows "?" and flags
 * the writer (the report is refused). Writes at most size bytes to out
 * and returns it. */
const char *plumbp_t_warning(writer *w, const char *text, char *out, size_t size);
/* The same in a writer of its own (JSON, GeoJSON: us 0), plain spaces;
 * returns 0 when a mark could not be read or a figure is not finite. */
int plumbp_warning_plain(const char *text, int us, char *out, size_t size);

/* A landing circle the zone's samples do not bound (landing_radius.hi_open):
 * the short words of the text report's line ("open: more samples needed
 * to bound it"), then into out what that leaves for the exclusion zone
 * and what to do: how many samples were counted against the circle's
 * centre and how many it takes (plumb_zone_min_samples), that the whole
 * clearance radius around the drop point is to be kept clear, and a
 * number of samples that bounds it. The text report's zone and the sheet
 * both say it in these words (one function, so that they cannot
 * diverge). Writes at most size bytes to out and returns it. */
#define PLUMBP_OPEN_BOUND "open: more samples needed to bound it"
/* What a zone without zone.scatter leaves out, in the words of the text
 * report and the sheet. */
#define PLUMBP_NO_SCATTER \
    "no scatter allowance given (zone.scatter): bounce and deflection are not included"
const char *plumbp_landing_open(const plumb_zone_result *r, char *out, size_t size);

/* A criterion's source ("not given" when empty) into buf: in a US report
 * each SI figure it quotes from its standard gets the US one in brackets
 * after it ("5.0 kg [11.0 lb] striker"). Returns buf. */
const char *plumbp_t_source(writer *w, const plumb_criterion *c, char *buf, size_t size);

/* A warning and the items it is about into buf (size bytes): the
 * sentence whole, then the items in brackets, "The shape's aspect ratio
 * ... is used. (torque wrench, cable tie bundle)", as the sweep's Warnings
 * give the rows and items after the sentence; "who: The ..." put a
 * capital after a colon. Just text when who is "". Returns buf. Defined
 * in report.c. */
const char *plumbp_who_text(char *buf, size_t size, const char *who, const char *text);

#endif /* PLUMB_REPORT_FORMAT_H */
