/*
** brakelight.h -- umbrella header of the brakelight core
** See Copyright Notice in LICENSE
*/
#ifndef BRAKELIGHT_H
#define BRAKELIGHT_H

#define BL_VERSION "0.1.0"

#include "bl_const.h"
#include "bl_errno.h"
#include "bl_result.h"
#include "bl_particle.h"
#include "bl_element.h"
#include "bl_models.h"
#include "bl_quad.h"
#include "bl_dcs.h"
#include "bl_material.h"
#include "bl_spectrum.h"
#include "bl_he.h"
#include "bl_integral.h"
#include "bl_suppress.h"

#endif
