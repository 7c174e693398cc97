// T-count reduction of a phase polynomial's odd part by third-order duplicate-then-destroy (TODD).
#pragma once

#include <cstdint>
#include <vector>

#include "tcount/gf2.h"

namespace whittle::tcount {

struct ToddSettings {
    /// Effort cap in words of GF(2) elimination (deterministic, unlike a clock); the reduction
    /// stops with what it has when it runs out.
    uint64_t work_budget = uint64_t(4) << 30;
};

struct ToddResult {
    std::vector<uint64_t> columns;  ///< the new odd parities (distinct, non-zero, sorted)
    int steps = 0;                  ///< rewrites applied
    uint64_t work = 0;              ///< words of elimination spent
    bool budget_exhausted = false;
};

/// Given the odd parities of a phase polynomial on n <= 64 variables (the columns of A, one T
/// gate each), returns columns A' with the same signature tensor S_abc = sum_j A_aj A_bj A_cj
/// mod 2 (indices not necessarily distinct), and at most as many columns. Equal columns are removed
/// in pairs and zero columns dropped first. The phase functions of A and A' then differ by an even
/// quadratic form, which the caller computes exactly (even_difference in phase_polynomial.h).
/// Deterministic.
ToddResult todd_reduce(std::vector<uint64_t> columns, uint32_t n, const ToddSettings& settings = {});

/// A basis of the updates y for which A + z y^T (with the column z appended when |y| is odd) has
/// the signature tensor of A (y[j] = 1: column j gets z added). For tests.
std::vector<std::vector<uint8_t>> admissible_updates(const std::vector<uint64_t>& columns, uint32_t n, uint64_t z);

/// M(e_j) = a_j a_j^T packed (upper triangle) for each column a_j: the echelon basis of their span
/// into `image` (tags: columns) and the kernel K0 (tags of the columns whose M is dependent) into
/// `k0`, the elimination's words added to `work`.
void image_of_columns(const std::vector<uint64_t>& cols, uint32_t n, TaggedEchelon& image, std::vector<BitVec>& k0,
                      uint64_t& work);

/// The same basis as BitVecs over the m columns, with the elimination's words added to `work`.
std::vector<BitVec> admissible_basis(const std::vector<uint64_t>& columns, uint32_t n, uint64_t z, uint64_t& work);

/// Removes zero columns and equal columns in pairs; sorts the rest.
void make_proper(std::vector<uint64_t>& columns);

/// True when the two column lists have the same signature tensor (all index triples, repeated
/// indices included). Cost n^3 / 6 per column; for tests and assertions.
bool same_signature(const std::vector<uint64_t>& a, const std::vector<uint64_t>& b, uint32_t n);

}  // namespace whittle::tcount
