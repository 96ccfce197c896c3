#include "report/drawing_output.h"

#include <cairo-pdf.h>
#include <cairo-svg.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <vector>

#include "core/atomic_file.h"
#include "core/error.h"
#include "report/cairo_handles.h"

namespace vicinal::report {

namespace {

void render(cairo_surface_t* surface, const Drawing& drawing, double scale, std::vector<TextItem>* layer,
            const std::string& where) {
  check_cairo(cairo_surface_status(surface), where, drawing.what);
  Context cr(cairo_create(surface));
  cairo_scale(cr.get(), scale, scale);
  PlotText text(cr.get(), layer);
  drawing.draw(cr.get(), text);
  check_cairo(cairo_status(cr.get()), where, drawing.what);
  cairo_surface_flush(surface);
}

std::string lower_extension(const std::filesystem::path& path) {
  std::string ext = path.extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return std::tolower(c); });
  return ext;
}

}  // namespace

std::string drawing_svg(const Drawing& drawing) {
  std::string svg;
  std::vector<TextItem> layer;
  const std::string where = fmt::format("SVG of {}", drawing.what);
  {
    Surface surface(cairo_svg_surface_create_for_stream(
        [](void* closure, const unsigned char* data, unsigned int length) {
          static_cast<std::string*>(closure)->append(reinterpret_cast<const char*>(data), length);
          return CAIRO_STATUS_SUCCESS;
        },
        &svg, drawing.width_pt, drawing.height_pt));
    render(surface.get(), drawing, 1.0, &layer, where);
    cairo_surface_finish(surface.get());
    check_cairo(cairo_surface_status(surface.get()), where, drawing.what);
  }
  return finish_svg(svg, drawing.title, layer);
}

void save_drawing(const Drawing& drawing, const std::filesystem::path& path) {
  const std::string ext = lower_extension(path);
  if (ext != ".svg" && ext != ".pdf" && ext != ".png")
    throw Error(fmt::format("cannot tell the figure format from the extension '{}'", path.extension().string()),
                {path.string()}, "name the file .svg, .pdf or .png");
  if (ext == ".svg") {
    write_file_atomically(path, drawing_svg(drawing));
    return;
  }
  const double w = drawing.width_pt, h = drawing.height_pt;
  write_via_temporary(path, [&](const std::filesystem::path& temporary) {
    if (ext == ".pdf") {
      Surface surface(cairo_pdf_surface_create(temporary.c_str(), w, h));
      check_cairo(cairo_surface_status(surface.get()), path.string(), drawing.what);
      cairo_pdf_surface_set_metadata(surface.get(), CAIRO_PDF_METADATA_TITLE, valid_utf8(drawing.title).c_str());
      cairo_pdf_surface_set_metadata(surface.get(), CAIRO_PDF_METADATA_CREATOR, "vicinal");
      render(surface.get(), drawing, 1.0, nullptr, path.string());
      cairo_surface_finish(surface.get());
      check_cairo(cairo_surface_status(surface.get()), path.string(), drawing.what);
    } else {
      const double scale = drawing.png_scale;
      Surface surface(cairo_image_surface_create(CAIRO_FORMAT_ARGB32, static_cast<int>(std::lround(w * scale)),
                                                 static_cast<int>(std::lround(h * scale))));
      render(surface.get(), drawing, scale, nullptr, path.string());
      check_cairo(cairo_surface_write_to_png(surface.get(), temporary.c_str()), path.string(), drawing.what);
    }
  });
}

}  // namespace vicinal::report
