/*
 * plumb/plumb.h - umbrella header of libplumb, the drop-and-descent safety
 * calculator library. Include this, or the module headers one by one.
 */
#ifndef PLUMB_PLUMB_H
#define PLUMB_PLUMB_H

#include "plumb/version.h"
#include "plumb/error.h"
#include "plumb/suggest.h"
#include "plumb/constants.h"
#include "plumb/units.h"
#include "plumb/atmosphere.h"
#include "plumb/gravity.h"
#include "plumb/wind.h"
#include "plumb/drag.h"
#include "plumb/inflation.h"
#include "plumb/glide.h"
#include "plumb/downwash.h"
#include "plumb/turbulence.h"
#include "plumb/trajectory.h"
#include "plumb/criteria.h"
#include "plumb/profile.h"
#include "plumb/judge.h"
#include "plumb/report.h"
#include "plumb/inverse.h"
#include "plumb/sweep.h"
#include "plumb/geodesy.h"
#include "plumb/region.h"
#include "plumb/dispersion.h"
#include "plumb/study.h"
#include "plumb/brief.h"
#include "plumb/verify.h"

#endif /* PLUMB_PLUMB_H */
