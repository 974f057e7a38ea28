// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Runtime.InteropServices;
using Periodic.Bands;
using Periodic.OpticalLattices;
using Periodic.Optics;
using Periodic.Properties;
using Periodic.Stacks;
using Periodic.Structures;

namespace Periodic.Native;

/// <summary>
/// Opaque handles: a C pointer is a <see cref="GCHandle"/> to an immutable object of the library, so the
/// runtime's handle table (not ours) keeps it alive until the matching destroy call.
/// </summary>
internal static unsafe class Handles
{
    public static void* New(object target) => (void*)GCHandle.ToIntPtr(GCHandle.Alloc(target));

    public static T Get<T>(void* handle, string name)
        where T : class
    {
        Status.RequireNotNull(handle, name);
        return GCHandle.FromIntPtr((nint)handle).Target as T
            ?? throw new HandleException(false, $"{name} is not a {Kind<T>()} handle.");
    }

    /// <summary>Releases a handle of the expected kind; NULL does nothing.</summary>
    public static void Free<T>(void* handle, string name)
        where T : class
    {
        if (handle == null)
        {
            return;
        }
        _ = Get<T>(handle, name);
        GCHandle.FromIntPtr((nint)handle).Free();
    }

    private static string Kind<T>() => typeof(T) switch
    {
        var t when t == typeof(UnitCell) => "periodic_cell",
        var t when t == typeof(BandsHandle) => "periodic_bands",
        var t when t == typeof(WannierFunction) => "periodic_wannier",
        _ => "periodic_stack",
    };
}

/// <summary>
/// What a periodic_bands handle holds: the library's solution (the facade chooses the method: exact for cells of layers,
/// which is every cell before ABI 2; plane waves or refined steps for smooth cells), its band structure and properties.
/// </summary>
internal sealed class BandsHandle(BandSolution solution)
{
    public BandStructure Structure { get; } = solution.Structure;

    /// <summary>The largest edge error of the solution, root finding and discretisation together, eV.</summary>
    public double MaxEdgeErrorElectronVolts { get; } = solution.MaxEdgeErrorElectronVolts;

    public BandProperties Properties { get; } = BandProperties.Create(solution.Structure);
}

/// <summary>
/// What a periodic_stack handle holds: the stack, its zero-bias transmission and, once asked, its bound levels and
/// intersubband transitions (each computed once, thread-safely, by <see cref="Lazy{T}"/>; a failure is cached and
/// reported again on every call, as the computation is deterministic).
/// </summary>
internal sealed class StackHandle(LayerStack stack)
{
    private readonly Lazy<StackTransmission> _unbiased = new(() => StackTransmission.Create(stack));
    private readonly Lazy<BoundStateSpectrum> _bound = new(() => BoundStateSpectrum.Find(stack));
    private readonly Lazy<IntersubbandSpectrum> _transitions = new(() => IntersubbandSpectrum.Compute(stack));

    public LayerStack Stack { get; } = stack;

    public StackTransmission Transmission(double biasElectronVolts) =>
        biasElectronVolts == 0 ? _unbiased.Value : StackTransmission.Create(Stack, Units.Energy.FromElectronVolts(biasElectronVolts));

    public BoundStateSpectrum BoundStates => _bound.Value;

    /// <summary>The intersubband spectrum with the library's default options (bound levels, the well's mass as reference).</summary>
    public IntersubbandSpectrum Transitions => _transitions.Value;
}
