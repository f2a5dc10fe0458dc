#pragma once

#include "case/case_description.h"

namespace fickcast
{
  class SectionReader;

  /**
   * Decides whether the case's content fraction is a release or an uptake, and checks the
   * fraction's event keys against it (output.release.* for a release, output.uptake.* for an
   * uptake; the other kind is refused at its line).
   *
   * An uptake: no output.loading and no dispersed phase; every face open in some stage
   * (concentration or transfer; no bath, no non-zero flux) holds one constant outside
   * concentration u_eq in the reference phase (an `ambient`, or a `value` over K when every region
   * has the same K); every region starts at a constant phase concentration c0 with c0 / K < u_eq.
   * Then the body tends to u_eq everywhere, and the fraction is (M - M0) / (M_eq - M0), the
   * fractional uptake M_t / M_inf of sorption (Crank 1975, The Mathematics of Diffusion, ch. 4
   * and 6). Everything else keeps the released fraction (M0 - M) / M0 (or over output.loading).
   */
  void decide_content_fraction(const SectionReader &reader, CaseDescription &c);
} // namespace fickcast
