// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Reflection;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using Periodic.Bands;
using Periodic.OpticalLattices;
using Periodic.Stacks;
using Periodic.Structures;
using Periodic.Units;

namespace Periodic.Native;

/// <summary>
/// The exported C functions declared in include/periodic.h. Each one is a thin wrapper: check pointers,
/// call the public API of Periodic, copy results into the caller's arrays, and turn every exception into a
/// status code with a thread-local message (<see cref="Status"/>), so no exception crosses the boundary.
/// </summary>
/// <remarks>
/// Extension point: new functions join as exports at the end of this class and of periodic.h, each addition raising
/// <see cref="AbiVersion"/> by one. Existing exports never change. ABI 2 added optical-lattice cells, intersubband
/// transitions of a stack and Wannier functions (hopping and on-site integral) of a band.
/// </remarks>
internal static unsafe class Exports
{
    /// <summary>PERIODIC_ABI_VERSION of include/periodic.h; raise both together when functions are added.</summary>
    public const int AbiVersion = 2;

    [UnmanagedCallersOnly(EntryPoint = "periodic_abi_version", CallConvs = [typeof(CallConvCdecl)])]
    public static int AbiVersionExport() => AbiVersion;

    [UnmanagedCallersOnly(EntryPoint = "periodic_version", CallConvs = [typeof(CallConvCdecl)])]
    public static int Version(byte* buffer, nuint capacity, nuint* required)
    {
        try
        {
            Status.RequireNotNull(required, nameof(required));
            var version = typeof(UnitCell).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion ?? "unknown";
            var status = Status.WriteString(version, buffer, capacity, required);
            return status == Status.Ok ? status : Status.Fail(status, $"buffer holds {capacity} bytes; {*required} are needed.");
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_last_error", CallConvs = [typeof(CallConvCdecl)])]
    public static int LastError(byte* buffer, nuint capacity, nuint* required)
    {
        try
        {
            // Never calls Status.Fail: reading the message must not replace it.
            return required == null ? Status.NullPointer : Status.WriteString(Status.LastError, buffer, capacity, required);
        }
        catch
        {
            return Status.Internal;
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_cell_create", CallConvs = [typeof(CallConvCdecl)])]
    public static int CellCreate(double* widthsNm, double* potentialsEv, double* massesM0, nuint layerCount, void** cell)
    {
        try
        {
            Status.RequireNotNull(cell, nameof(cell));
            Status.RequireNotNull(widthsNm, "widths_nm");
            Status.RequireNotNull(potentialsEv, "potentials_ev");
            Status.RequireNotNull(massesM0, "masses_m0");
            var n = CheckLength(layerCount, "layer_count");
            var created = UnitCell.FromLayers(new ReadOnlySpan<double>(widthsNm, n), new ReadOnlySpan<double>(potentialsEv, n), new ReadOnlySpan<double>(massesM0, n));
            *cell = Handles.New(created);
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_cell_destroy", CallConvs = [typeof(CallConvCdecl)])]
    public static int CellDestroy(void* cell) => Destroy<UnitCell>(cell, nameof(cell));

    [UnmanagedCallersOnly(EntryPoint = "periodic_cell_period", CallConvs = [typeof(CallConvCdecl)])]
    public static int CellPeriod(void* cell, double* periodNm)
    {
        try
        {
            var c = Handles.Get<UnitCell>(cell, nameof(cell));
            Status.RequireNotNull(periodNm, "period_nm");
            *periodNm = c.Period.Nanometres;
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_bands_compute", CallConvs = [typeof(CallConvCdecl)])]
    public static int BandsCompute(void* cell, int count, void** bands)
    {
        try
        {
            var c = Handles.Get<UnitCell>(cell, nameof(cell));
            Status.RequireNotNull(bands, nameof(bands));
            *bands = Handles.New(new BandsHandle(BandSolver.Compute(c, count)));
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_bands_destroy", CallConvs = [typeof(CallConvCdecl)])]
    public static int BandsDestroy(void* bands) => Destroy<BandsHandle>(bands, nameof(bands));

    [UnmanagedCallersOnly(EntryPoint = "periodic_bands_count", CallConvs = [typeof(CallConvCdecl)])]
    public static int BandsCount(void* bands, int* count)
    {
        try
        {
            var b = Handles.Get<BandsHandle>(bands, nameof(bands));
            Status.RequireNotNull(count, nameof(count));
            *count = b.Structure.Bands.Count;
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_bands_edges", CallConvs = [typeof(CallConvCdecl)])]
    public static int BandsEdges(void* bands, double* bottomEv, double* topEv, nuint capacity) =>
        PerBand(bands, bottomEv, "bottom_ev", topEv, "top_ev", capacity, (b, i) => (b.Structure.Bands[i].BottomElectronVolts, b.Structure.Bands[i].TopElectronVolts));

    [UnmanagedCallersOnly(EntryPoint = "periodic_bands_edge_errors", CallConvs = [typeof(CallConvCdecl)])]
    public static int BandsEdgeErrors(void* bands, double* bottomErrorEv, double* topErrorEv, nuint capacity) =>
        PerBand(bands, bottomErrorEv, "bottom_error_ev", topErrorEv, "top_error_ev", capacity, (b, i) => (b.Structure.Bands[i].BottomErrorElectronVolts, b.Structure.Bands[i].TopErrorElectronVolts));

    [UnmanagedCallersOnly(EntryPoint = "periodic_bands_masses", CallConvs = [typeof(CallConvCdecl)])]
    public static int BandsMasses(void* bands, double* bottomMassM0, double* topMassM0, nuint capacity) =>
        PerBand(bands, bottomMassM0, "bottom_mass_m0", topMassM0, "top_mass_m0", capacity, (b, i) =>
        {
            var index = b.Structure.Bands[i].Index;
            return (b.Properties.BottomMass(index).ElectronMasses, b.Properties.TopMass(index).ElectronMasses);
        });

    [UnmanagedCallersOnly(EntryPoint = "periodic_bands_accuracy", CallConvs = [typeof(CallConvCdecl)])]
    public static int BandsAccuracy(void* bands, double* maxEdgeErrorEv, int* countChecks)
    {
        try
        {
            var b = Handles.Get<BandsHandle>(bands, nameof(bands));
            Status.RequireNotNull(maxEdgeErrorEv, "max_edge_error_ev");
            Status.RequireNotNull(countChecks, "count_checks");
            *maxEdgeErrorEv = b.MaxEdgeErrorElectronVolts;
            *countChecks = b.Structure.CountChecks;
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_bands_energies", CallConvs = [typeof(CallConvCdecl)])]
    public static int BandsEnergies(void* bands, int bandIndex, double* kPerNm, double* energiesEv, nuint count)
    {
        try
        {
            var b = Handles.Get<BandsHandle>(bands, nameof(bands));
            var n = CheckArrays(kPerNm, "k_per_nm", energiesEv, "energies_ev", count);
            b.Structure.EnergiesAt(bandIndex, new ReadOnlySpan<double>(kPerNm, n), new Span<double>(energiesEv, n));
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_bands_dos", CallConvs = [typeof(CallConvCdecl)])]
    public static int BandsDos(void* bands, double* energiesEv, double* dosPerEvNm, nuint count)
    {
        try
        {
            var b = Handles.Get<BandsHandle>(bands, nameof(bands));
            var n = CheckArrays(energiesEv, "energies_ev", dosPerEvNm, "dos_per_ev_nm", count);
            b.Properties.DensitiesOfStates(new ReadOnlySpan<double>(energiesEv, n), new Span<double>(dosPerEvNm, n));
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_stack_create", CallConvs = [typeof(CallConvCdecl)])]
    public static int StackCreate(void* cell, int periods, double leftPotentialEv, double leftMassM0, double rightPotentialEv, double rightMassM0, void** stack)
    {
        try
        {
            var c = Handles.Get<UnitCell>(cell, nameof(cell));
            Status.RequireNotNull(stack, nameof(stack));
            var left = Lead.Create(Energy.FromElectronVolts(leftPotentialEv), EffectiveMass.FromElectronMasses(leftMassM0));
            var right = Lead.Create(Energy.FromElectronVolts(rightPotentialEv), EffectiveMass.FromElectronMasses(rightMassM0));
            *stack = Handles.New(new StackHandle(LayerStack.Periodic(left, c, periods, right)));
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_stack_destroy", CallConvs = [typeof(CallConvCdecl)])]
    public static int StackDestroy(void* stack) => Destroy<StackHandle>(stack, nameof(stack));

    [UnmanagedCallersOnly(EntryPoint = "periodic_stack_transmission", CallConvs = [typeof(CallConvCdecl)])]
    public static int StackTransmissionExport(void* stack, double biasEv, double* energiesEv, double* transmission, nuint count)
    {
        try
        {
            var s = Handles.Get<StackHandle>(stack, nameof(stack));
            var n = CheckArrays(energiesEv, "energies_ev", transmission, nameof(transmission), count);
            s.Transmission(biasEv).Transmissions(new ReadOnlySpan<double>(energiesEv, n), new Span<double>(transmission, n));
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_stack_bound_levels", CallConvs = [typeof(CallConvCdecl)])]
    public static int StackBoundLevels(void* stack, double* energiesEv, double* errorsEv, nuint capacity, nuint* count)
    {
        try
        {
            var s = Handles.Get<StackHandle>(stack, nameof(stack));
            Status.RequireNotNull(count, nameof(count));
            var levels = s.BoundStates.Levels;
            *count = (nuint)levels.Count;
            if (capacity == 0 && energiesEv == null && errorsEv == null)
            {
                return Status.Ok;
            }
            Status.RequireNotNull(energiesEv, "energies_ev");
            Status.RequireNotNull(errorsEv, "errors_ev");
            Status.RequireCapacity(capacity, levels.Count, "energies_ev and errors_ev");
            for (var i = 0; i < levels.Count; i++)
            {
                energiesEv[i] = levels[i].EnergyElectronVolts;
                errorsEv[i] = levels[i].ErrorElectronVolts;
            }
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    // ---- ABI 2: optical-lattice cells, intersubband transitions, Wannier functions -------------------------------

    [UnmanagedCallersOnly(EntryPoint = "periodic_cell_create_optical_lattice", CallConvs = [typeof(CallConvCdecl)])]
    public static int CellCreateOpticalLattice(double wavelengthNm, double depthRecoil, double massU, void** cell)
    {
        try
        {
            Status.RequireNotNull(cell, nameof(cell));
            // A non-finite wavelength is named as the C caller knows it (Length.FromNanometres would name its own parameter).
            var wavelength = double.IsFinite(wavelengthNm) ? Length.FromNanometres(wavelengthNm)
                : throw new ArgumentOutOfRangeException("wavelength_nm", wavelengthNm, $"wavelength_nm must be a positive, finite wavelength in nm; got {wavelengthNm.ToString("R", System.Globalization.CultureInfo.InvariantCulture)}.");
            var lattice = OpticalLattice.Create(wavelength, depthRecoil, AtomicSpecies.FromMass(massU));
            *cell = Handles.New(lattice.Cell);
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_stack_transitions", CallConvs = [typeof(CallConvCdecl)])]
    public static int StackTransitions(void* stack, int* from, int* to, double* energiesEv, double* dipolesNm, double* oscillatorStrengths,
        int* resolved, nuint capacity, nuint* count)
    {
        try
        {
            var s = Handles.Get<StackHandle>(stack, nameof(stack));
            Status.RequireNotNull(count, nameof(count));
            var transitions = s.Transitions.Transitions;
            *count = (nuint)transitions.Count;
            if (capacity == 0 && from == null && to == null && energiesEv == null && dipolesNm == null && oscillatorStrengths == null && resolved == null)
            {
                return Status.Ok;
            }
            Status.RequireNotNull(from, nameof(from));
            Status.RequireNotNull(to, nameof(to));
            Status.RequireNotNull(energiesEv, "energies_ev");
            Status.RequireNotNull(dipolesNm, "dipoles_nm");
            Status.RequireNotNull(oscillatorStrengths, "oscillator_strengths");
            Status.RequireNotNull(resolved, nameof(resolved));
            Status.RequireCapacity(capacity, transitions.Count, "from, to, energies_ev, dipoles_nm, oscillator_strengths and resolved");
            for (var i = 0; i < transitions.Count; i++)
            {
                var t = transitions[i];
                from[i] = t.From;
                to[i] = t.To;
                energiesEv[i] = t.EnergyElectronVolts;
                // An unresolved transition has no numbers (the .NET properties refuse them): 0 with resolved = 0, never NaN.
                dipolesNm[i] = t.IsResolved ? t.DipoleNanometres : 0;
                oscillatorStrengths[i] = t.IsResolved ? t.OscillatorStrength : 0;
                resolved[i] = t.IsResolved ? 1 : 0;
            }
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_stack_transitions_accuracy", CallConvs = [typeof(CallConvCdecl)])]
    public static int StackTransitionsAccuracy(void* stack, double* referenceMassM0, double* normalisationError)
    {
        try
        {
            var s = Handles.Get<StackHandle>(stack, nameof(stack));
            Status.RequireNotNull(referenceMassM0, "reference_mass_m0");
            Status.RequireNotNull(normalisationError, "normalisation_error");
            var spectrum = s.Transitions;
            *referenceMassM0 = spectrum.ReferenceMassElectronMasses;
            *normalisationError = spectrum.NormalisationError;
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_wannier_compute", CallConvs = [typeof(CallConvCdecl)])]
    public static int WannierCompute(void* cell, int bandIndex, void** wannier)
    {
        try
        {
            var c = Handles.Get<UnitCell>(cell, nameof(cell));
            Status.RequireNotNull(wannier, nameof(wannier));
            *wannier = Handles.New(WannierFunction.Compute(c, bandIndex));
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_wannier_destroy", CallConvs = [typeof(CallConvCdecl)])]
    public static int WannierDestroy(void* wannier) => Destroy<WannierFunction>(wannier, nameof(wannier));

    [UnmanagedCallersOnly(EntryPoint = "periodic_wannier_hopping", CallConvs = [typeof(CallConvCdecl)])]
    public static int WannierHopping(void* wannier, double* hoppingEv, nuint capacity, nuint* count)
    {
        try
        {
            var w = Handles.Get<WannierFunction>(wannier, nameof(wannier));
            Status.RequireNotNull(count, nameof(count));
            var hopping = w.HoppingElectronVolts;
            *count = (nuint)hopping.Count;
            if (capacity == 0 && hoppingEv == null)
            {
                return Status.Ok;
            }
            Status.RequireNotNull(hoppingEv, "hopping_ev");
            Status.RequireCapacity(capacity, hopping.Count, "hopping_ev");
            for (var i = 0; i < hopping.Count; i++)
            {
                hoppingEv[i] = hopping[i];
            }
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_wannier_on_site", CallConvs = [typeof(CallConvCdecl)])]
    public static int WannierOnSite(void* wannier, double* onSiteIntegralPerNm, double* meanEnergyEv)
    {
        try
        {
            var w = Handles.Get<WannierFunction>(wannier, nameof(wannier));
            Status.RequireNotNull(onSiteIntegralPerNm, "on_site_integral_per_nm");
            Status.RequireNotNull(meanEnergyEv, "mean_energy_ev");
            *onSiteIntegralPerNm = w.OnSiteIntegralPerNanometre;
            *meanEnergyEv = w.MeanEnergyElectronVolts;
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    [UnmanagedCallersOnly(EntryPoint = "periodic_wannier_accuracy", CallConvs = [typeof(CallConvCdecl)])]
    public static int WannierAccuracy(void* wannier, double* normalisationError, double* tailRatio, int* kPoints)
    {
        try
        {
            var w = Handles.Get<WannierFunction>(wannier, nameof(wannier));
            Status.RequireNotNull(normalisationError, "normalisation_error");
            Status.RequireNotNull(tailRatio, "tail_ratio");
            Status.RequireNotNull(kPoints, "k_points");
            *normalisationError = w.NormalisationError;
            *tailRatio = w.TailRatio;
            *kPoints = w.KPointCount;
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    private static int Destroy<T>(void* handle, string name)
        where T : class
    {
        try
        {
            Handles.Free<T>(handle, name);
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    /// <summary>Fills two per-band arrays; the capacity must cover every band.</summary>
    private static int PerBand(void* bands, double* first, string firstName, double* second, string secondName, nuint capacity, Func<BandsHandle, int, (double First, double Second)> value)
    {
        try
        {
            var b = Handles.Get<BandsHandle>(bands, nameof(bands));
            Status.RequireNotNull(first, firstName);
            Status.RequireNotNull(second, secondName);
            var count = b.Structure.Bands.Count;
            Status.RequireCapacity(capacity, count, $"{firstName} and {secondName}");
            for (var i = 0; i < count; i++)
            {
                (first[i], second[i]) = value(b, i);
            }
            return Status.Ok;
        }
        catch (Exception e)
        {
            return Status.FromException(e);
        }
    }

    private static int CheckArrays(double* input, string inputName, double* output, string outputName, nuint count)
    {
        var n = CheckLength(count, "count");
        if (n > 0)
        {
            Status.RequireNotNull(input, inputName);
            Status.RequireNotNull(output, outputName);
        }
        return n;
    }

    private static int CheckLength(nuint count, string name) =>
        count <= int.MaxValue ? (int)count : throw new ArgumentOutOfRangeException(name, $"{name} must be at most {int.MaxValue}; got {count}.");
}
