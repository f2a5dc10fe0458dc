// The machine's memory bandwidth as a STREAM-like triad a[i] = b[i] + s c[i] on arrays far larger
// than the caches (3 x 80 MB), best of 10 repetitions, one core. Time per CG iteration can be set
// against it: an iteration must at least stream the matrix (or the coefficients) and a few vectors.
// Asserts nothing; prints GB/s (counting 24 bytes moved per element, as STREAM does).
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <vector>

int main()
{
  const std::size_t n = 10'000'000;
  std::vector<double> a(n, 0.0), b(n, 1.0), c(n, 2.0);
  double best = 1e30;
  for (int repeat = 0; repeat < 10; ++repeat)
    {
      const auto start = std::chrono::steady_clock::now();
      const double s = 3.0 + repeat * 1e-9;
      for (std::size_t i = 0; i < n; ++i)
        a[i] = b[i] + s * c[i];
      const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
      best = std::min(best, seconds);
    }
  std::printf("memory bandwidth (triad, one core): %.2f GB/s (a[0] = %g)\n", 24.0 * n / best / 1e9, a[0]);
  return 0;
}
