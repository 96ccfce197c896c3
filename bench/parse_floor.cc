// The floor for reading a multi-model PDB: read the whole file and parse the
// three coordinates of every ATOM/HETATM line with std::from_chars, with no
// checks, no topology and no frame bookkeeping. Prints the line count and a
// checksum so the work cannot be optimised away.
#include <charconv>
#include <cstdio>
#include <fstream>
#include <iterator>
#include <string>

int main(int argc, char** argv) {
  if (argc != 2) {
    std::fprintf(stderr, "usage: parse_floor FILE.pdb\n");
    return 2;
  }
  std::ifstream in(argv[1], std::ios::binary);
  const std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  double sum = 0;
  long atoms = 0;
  for (std::size_t pos = 0; pos < text.size();) {
    std::size_t end = text.find('\n', pos);
    if (end == std::string::npos) end = text.size();
    const char* line = text.data() + pos;
    if (end - pos >= 54 && (text.compare(pos, 4, "ATOM") == 0 || text.compare(pos, 6, "HETATM") == 0)) {
      for (int c = 0; c < 3; ++c) {
        const char* field = line + 30 + 8 * c;
        while (*field == ' ') ++field;
        double v = 0;
        std::from_chars(field, line + 38 + 8 * c, v);
        sum += v;
      }
      ++atoms;
    }
    pos = end + 1;
  }
  std::printf("%ld %.3f\n", atoms, sum);
  return 0;
}
