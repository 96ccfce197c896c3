#include "cli/command.h"

int main(int argc, char** argv) { return vicinal::cli::run(argc, argv); }
