// The library generator: enumerate gate sequences, group by fingerprint, prove, keep a minimal set.
#pragma once

#include <cstddef>
#include <cstdint>

#include "rules/library.h"

namespace whittle::rulegen {

struct DeriveStats {
    size_t sequences = 0;   ///< canonical sequences fingerprinted
    size_t classes = 0;     ///< distinct fingerprints (representatives and their wire renamings)
    size_t candidates = 0;  ///< sequences equal to an earlier representative
    /// Candidates dropped as implied by smaller rules: the sides share a first or last gate, fall
    /// apart into identities on disjoint wires, only reorder the same gates (commutations), or
    /// shorten to one sequence by the shorter rules kept before them (angles substituted), are a
    /// kept rule with its angles substituted; and
    /// candidates whose representative has a parameter the sequence lacks.
    size_t implied = 0;
    size_t unproved = 0;    ///< candidates the exact proof did not confirm (fingerprint collisions or undecided)
    size_t rules = 0;
};

/// Derives the library of `set` by the method of Xu et al. 2022 (arXiv:2204.09033): sequences are
/// built one gate at a time from representatives whose every shorter prefix and suffix is itself a
/// representative, in a canonical order of wires, parameters and commuting gates; each sequence is
/// fingerprinted by its unitary at fixed random parameter values up to global phase; a sequence
/// whose fingerprint is taken becomes the rule sequence = representative, kept when it is not
/// implied by smaller rules (DeriveStats::implied) and rulegen/prove.h proves it. Deterministic.
rules::Library derive_library(const rules::GateSet& set, DeriveStats* stats = nullptr);

}  // namespace whittle::rulegen
