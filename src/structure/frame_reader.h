// A fast coordinate-only reader for long trajectories of one topology:
// multi-model PDB (MODEL/ENDMDL, or frames separated by END) and multi-frame
// XYZ. It streams: one callback per frame with that frame's coordinates, so
// averages over millions of frames need memory for one frame only. Open Babel
// reads the first frame (topology); this reader never builds molecules.
#pragma once

#include <cstddef>
#include <functional>
#include <span>
#include <string>
#include <vector>

namespace vicinal::structure {

// frame: 0-based frame index; xyz: 3 * atom_count values (atom-major).
using FrameCallback = std::function<void(std::size_t frame, std::span<const double> xyz)>;

enum class FrameFormat { Pdb, Xyz };

// Format from the extension (.pdb, .ent, .xyz); vicinal::Error otherwise.
FrameFormat frame_format_of(const std::string& path);

// Streams every frame (the first included). `atomic_numbers` (one per atom, in
// file order) fixes the atom count and, where the file states elements, the
// elements. A frame with another atom count or element, a truncated frame or
// an unparsable coordinate is a vicinal::Error naming the file, the line and
// the 1-based frame. Returns the number of frames.
std::size_t stream_frames(const std::string& path, const std::vector<int>& atomic_numbers,
                          const FrameCallback& on_frame);

}  // namespace vicinal::structure
