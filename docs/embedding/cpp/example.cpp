// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors
//
// Periodic from C++: the same C header, handles owned by std::unique_ptr, status codes turned into exceptions.
// Build and run from the repository root:
//   g++ -std=c++17 -Wall -Wextra -Werror -Iinclude docs/embedding/cpp/example.cpp -Lartifacts/native
//       -lperiodic -Wl,-rpath,'$ORIGIN' -o artifacts/native/example-cpp && artifacts/native/example-cpp   (one line)
#include <cstdio>
#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

#include "periodic.h"

namespace {

// Throws with the library's message when a call failed.
void check(int32_t status)
{
    if (status == PERIODIC_OK) {
        return;
    }
    size_t required = 0;
    periodic_last_error(nullptr, 0, &required);
    std::string message(required, '\0');
    periodic_last_error(message.data(), message.size(), &required);
    message.resize(required > 0 ? required - 1 : 0);
    throw std::runtime_error("periodic status " + std::to_string(status) + ": " + message);
}

using Cell = std::unique_ptr<periodic_cell, decltype(&periodic_cell_destroy)>;
using Bands = std::unique_ptr<periodic_bands, decltype(&periodic_bands_destroy)>;

}  // namespace

int main()
{
    try {
        const std::vector<double> widths_nm{5.0, 2.0}, potentials_ev{0.0, 0.25}, masses_m0{0.067, 0.092};
        periodic_cell *raw_cell = nullptr;
        check(periodic_cell_create(widths_nm.data(), potentials_ev.data(), masses_m0.data(), widths_nm.size(), &raw_cell));
        Cell cell(raw_cell, periodic_cell_destroy);
        periodic_bands *raw_bands = nullptr;
        check(periodic_bands_compute(cell.get(), 4, &raw_bands));
        Bands bands(raw_bands, periodic_bands_destroy);
        std::vector<double> bottom(4), top(4);
        check(periodic_bands_edges(bands.get(), bottom.data(), top.data(), bottom.size()));
        for (size_t i = 0; i < bottom.size(); i++) {
            std::printf("band %zu bottom %.17g top %.17g\n", i + 1, bottom[i], top[i]);
        }
        const double bad_widths[] = {5.0, -2.0};
        check(periodic_cell_create(bad_widths, potentials_ev.data(), masses_m0.data(), 2, &raw_cell));
    } catch (const std::runtime_error &error) {
        std::printf("refused as expected: %s\n", error.what());
        return 0;
    }
    return 1;  // the bad cell above must have been refused
}
