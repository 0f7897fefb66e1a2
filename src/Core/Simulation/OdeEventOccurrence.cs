using System.Collections.Immutable;

namespace Patchproof.Core.Simulation;

/// <summary>One located event.</summary>
/// <param name="EventIndex">The index of the event in <see cref="DormandPrince45.Events"/>.</param>
/// <param name="Time">The located time, in the system's time unit.</param>
/// <param name="State">The interpolated state at <paramref name="Time"/>.</param>
public sealed record OdeEventOccurrence(int EventIndex, double Time, ImmutableArray<double> State);
