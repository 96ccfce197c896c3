// Owning handles for cairo objects and a status check that turns a cairo
// failure into a vicinal::Error naming the output file; shared by every
// figure writer in report/.
#pragma once

#include <cairo.h>
#include <fmt/format.h>

#include <memory>
#include <string>

#include "core/error.h"

namespace vicinal::report {

struct SurfaceDeleter {
  void operator()(cairo_surface_t* s) const { cairo_surface_destroy(s); }
};
struct ContextDeleter {
  void operator()(cairo_t* c) const { cairo_destroy(c); }
};
using Surface = std::unique_ptr<cairo_surface_t, SurfaceDeleter>;
using Context = std::unique_ptr<cairo_t, ContextDeleter>;

// `what` names the drawing in the message, e.g. "the figure", "the heat map".
inline void check_cairo(cairo_status_t status, const std::string& where, const char* what) {
  if (status != CAIRO_STATUS_SUCCESS)
    throw Error(fmt::format("cannot draw {}: {}", what, cairo_status_to_string(status)), {where},
                "check free space and permissions of the output folder");
}

}  // namespace vicinal::report
