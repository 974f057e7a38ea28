// SPDX-License-Identifier: MIT
// Copyright (c) 2026 Periodic contributors

using Periodic.OpticalLattices;
using Periodic.Units;

namespace Periodic.Serialization;

public static partial class StructureFile
{
    private static readonly Dictionary<string, double> AtomicMassUnits = new(StringComparer.Ordinal)
    {
        ["u"] = 1.0, ["Da"] = 1.0,
    };

    private static readonly Dictionary<string, double> AngleUnits = new(StringComparer.Ordinal)
    {
        ["rad"] = 1.0, ["deg"] = Math.PI / 180, ["°"] = Math.PI / 180,
    };

    private static readonly Dictionary<string, double> RecoilUnits = new(StringComparer.Ordinal)
    {
        ["E_R"] = 1.0, ["Er"] = 1.0, ["ER"] = 1.0,
    };

    private sealed partial class Context
    {
        /// <summary>
        /// <c>"opticalLattice": {"wavelength": λ, "depth": s, "species": "87Rb" | "mass": "86.909 u",
        /// "secondWave": {"wavelength": λ₂, "depth": s₂, "phase": φ}}</c> in place of <c>"cell"</c>: depths in recoil
        /// energies of the first wave, the phase in radians (or "90 deg").
        /// </summary>
        private StructureDefinition ReadOpticalLatticeDocument(Dictionary<string, JsonTreeProperty> document, string name, string? description)
        {
            foreach (var key in new[] { "cell", "temperature", "carrier", "nonParabolic", "substrate", "stack" })
            {
                if (document.TryGetValue(key, out var stray))
                {
                    throw ErrorAt(stray.NameOffset, key, "cannot be combined with \"opticalLattice\", which defines the whole cell.");
                }
            }
            const string path = "opticalLattice";
            var obj = ExpectObject(document[path].Value, path);
            var fields = Fields(obj, path, ["wavelength", "depth", "species", "mass", "secondWave"]);
            var wavelengthNode = Required(fields, obj, path, "wavelength");
            var wavelength = ReadPositive(wavelengthNode, path + ".wavelength", LengthUnits, "nm", "nm, Å, pm, µm");
            var depthNode = Required(fields, obj, path, "depth");
            var depth = ReadPositive(depthNode, path + ".depth", RecoilUnits, "E_R", "E_R");
            CheckDepth(depthNode, path + ".depth", depth);
            AtomicSpecies species;
            if (fields.TryGetValue("species", out var speciesField))
            {
                if (fields.TryGetValue("mass", out var both))
                {
                    throw ErrorAt(both.NameOffset, path + ".mass", "give either \"species\" or \"mass\", not both.");
                }
                var speciesName = ReadString(speciesField.Value, path + ".species");
                species = Apply(speciesField.Value, path + ".species", () => AtomicSpecies.Find(speciesName));
            }
            else
            {
                var massNode = Required(fields, obj, path, "mass", $" (or \"species\": one of {AtomicSpecies.KnownNames})");
                var mass = ReadPositive(massNode, path + ".mass", AtomicMassUnits, "u", "u, Da");
                species = AtomicSpecies.FromMass(mass);
            }
            var lattice = Apply(obj, path, () => OpticalLattice.Create(Length.FromNanometres(wavelength), depth, species));
            if (fields.TryGetValue("secondWave", out var secondField))
            {
                const string second = path + ".secondWave";
                var secondObj = ExpectObject(secondField.Value, second);
                var secondFields = Fields(secondObj, second, ["wavelength", "depth", "phase"]);
                var secondWavelengthNode = Required(secondFields, secondObj, second, "wavelength");
                var secondWavelength = ReadPositive(secondWavelengthNode, second + ".wavelength", LengthUnits, "nm", "nm, Å, pm, µm");
                var secondDepthNode = Required(secondFields, secondObj, second, "depth");
                var secondDepth = ReadQuantity(secondDepthNode, second + ".depth", RecoilUnits, "E_R", "E_R of the first wave");
                if (secondDepth < 0)
                {
                    throw Error(secondDepthNode, second + ".depth", $"must be zero or positive; got {Format(secondDepth)}.");
                }
                CheckDepth(secondDepthNode, second + ".depth", secondDepth);
                var phase = secondFields.TryGetValue("phase", out var phaseField) ? ReadQuantity(phaseField.Value, second + ".phase", AngleUnits, "rad", "rad, deg") : 0.0;
                lattice = Apply(secondWavelengthNode, second + ".wavelength", () => lattice.WithSecondWave(Length.FromNanometres(secondWavelength), secondDepth, phase));
            }
            return new StructureDefinition(name, description, lattice.Cell, [null], sourceName, null, null, default) { OpticalLattice = lattice };
        }

        private void CheckDepth(JsonTreeNode node, string path, double depth)
        {
            if (depth > StructureFileLimits.MaxLatticeDepthRecoilEnergies)
            {
                throw Error(node, path, $"must be at most {Format(StructureFileLimits.MaxLatticeDepthRecoilEnergies)} E_R (about 10 mK for 87Rb at 1064 nm, beyond any optical trap); got {Format(depth)} E_R.");
            }
        }

        private double ReadPositive(JsonTreeNode node, string path, Dictionary<string, double> units, string defaultUnit, string allowed)
        {
            var value = ReadQuantity(node, path, units, defaultUnit, allowed);
            if (!(value > 0))
            {
                throw Error(node, path, $"must be positive; got {Format(value)} {defaultUnit}.");
            }
            return value;
        }
    }
}
