// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using System.Runtime.InteropServices;
using Periodic.Bands;
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

    private static string Kind<T>() =>
        typeof(T) == typeof(UnitCell) ? "periodic_cell" : typeof(T) == typeof(BandsHandle) ? "periodic_bands" : "periodic_stack";
}

/// <summary>What a periodic_bands handle holds: the band structure and its derived properties.</summary>
internal sealed class BandsHandle(BandStructure structure)
{
    public BandStructure Structure { get; } = structure;

    public BandProperties Properties { get; } = BandProperties.Create(structure);
}

/// <summary>What a periodic_stack handle holds: the stack, its zero-bias transmission and, once asked, its bound levels.</summary>
internal sealed class StackHandle(LayerStack stack)
{
    private readonly Lazy<StackTransmission> _unbiased = new(() => StackTransmission.Create(stack));
    private readonly Lazy<BoundStateSpectrum> _bound = new(() => BoundStateSpectrum.Find(stack));

    public LayerStack Stack { get; } = stack;

    public StackTransmission Transmission(double biasElectronVolts) =>
        biasElectronVolts == 0 ? _unbiased.Value : StackTransmission.Create(Stack, Units.Energy.FromElectronVolts(biasElectronVolts));

    public BoundStateSpectrum BoundStates => _bound.Value;
}
