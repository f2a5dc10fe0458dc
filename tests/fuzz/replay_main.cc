// The replay driver: a fuzz harness without libFuzzer. Feeds every file of the folders (or the
// files) named on the command line to LLVMFuzzerTestOneInput, in name order, so the normal build
// checks the stored corpus (tests/fuzz/corpus/HARNESS) on every ctest run. A finding aborts the
// run (the harness aborts, or a crash or an uncaught exception ends it), naming the input last
// printed. Replaying no input at all is a failure too: an empty corpus would pass unnoticed.
#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <iterator>
#include <string>
#include <vector>

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, std::size_t size);
/// Defined by a harness that needs set-up (MPI), called once before the inputs as libFuzzer does.
extern "C" int LLVMFuzzerInitialize(int *argc, char ***argv) __attribute__((weak));

int main(int argc, char **argv)
{
  namespace fs = std::filesystem;
  std::vector<fs::path> inputs;
  for (int i = 1; i < argc; ++i)
    {
      const fs::path given(argv[i]);
      if (fs::is_directory(given))
        {
          for (const auto &entry : fs::directory_iterator(given))
            if (entry.is_regular_file())
              inputs.push_back(entry.path());
        }
      else if (fs::is_regular_file(given))
        inputs.push_back(given);
      else
        {
          std::cerr << "replay: no such file or folder: " << given.string() << '\n';
          return 2;
        }
    }
  std::sort(inputs.begin(), inputs.end());
  if (inputs.empty())
    {
      std::cerr << "replay: no inputs to replay (usage: " << argv[0] << " FOLDER_OR_FILE...)\n";
      return 2;
    }
  if (LLVMFuzzerInitialize != nullptr)
    LLVMFuzzerInitialize(&argc, &argv);
  for (const auto &input : inputs)
    {
      std::cout << "replaying " << input.string() << std::endl;
      std::ifstream in(input, std::ios::binary);
      const std::string bytes((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
      if (!in.good() && !in.eof())
        {
          std::cerr << "replay: cannot read " << input.string() << '\n';
          return 2;
        }
      LLVMFuzzerTestOneInput(reinterpret_cast<const uint8_t *>(bytes.data()), bytes.size());
    }
  std::cout << inputs.size() << " inputs replayed without a finding\n";
  return 0;
}
