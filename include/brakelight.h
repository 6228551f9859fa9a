/*
** brakelight.h -- umbrella header of the brakelight core: every public
** header of include/brakelight/
** See Copyright Notice in LICENSE
*/
#ifndef BRAKELIGHT_H
#define BRAKELIGHT_H

#include "brakelight/bl_version.h"
#include "brakelight/bl_const.h"
#include "brakelight/bl_errno.h"
#include "brakelight/bl_result.h"
#include "brakelight/bl_particle.h"
#include "brakelight/bl_element.h"
#include "brakelight/bl_models.h"
#include "brakelight/bl_quad.h"
#include "brakelight/bl_dcs.h"
#include "brakelight/bl_corrections.h"
#include "brakelight/bl_material.h"
#include "brakelight/bl_method.h"
#include "brakelight/bl_spectrum.h"
#include "brakelight/bl_integral.h"
#include "brakelight/bl_suppress.h"
#include "brakelight/bl_target.h"
#include "brakelight/bl_sampler.h"
#include "brakelight/bl_ebrems.h"

#endif
