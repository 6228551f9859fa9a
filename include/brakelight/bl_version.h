/*
** bl_version.h -- the version of brakelight, defined here once: the
** Makefile reads it for the shared library, pkg-config file, rockspec and
** man pages; the runner and the Lua module report it
** See Copyright Notice in LICENSE
*/
#ifndef BL_VERSION_H
#define BL_VERSION_H

#define BL_VERSION_MAJOR 1
#define BL_VERSION_MINOR 0
#define BL_VERSION_PATCH 0
#define BL_VERSION "1.0.0"

#endif
