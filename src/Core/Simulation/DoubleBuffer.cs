namespace Patchproof.Core.Simulation;

/// <summary>A growable list of doubles appended in blocks; doubling keeps the amortized cost per append constant.</summary>
internal sealed class DoubleBuffer(int initialCapacity)
{
    private double[] items = new double[Math.Max(initialCapacity, 4)];

    /// <summary>The number of values stored.</summary>
    public int Count { get; private set; }

    /// <summary>The stored values.</summary>
    public ReadOnlySpan<double> Values => items.AsSpan(0, Count);

    /// <summary>Appends one value.</summary>
    public void Add(double value)
    {
        EnsureRoom(1);
        items[Count++] = value;
    }

    /// <summary>Appends a block of values.</summary>
    public void Add(ReadOnlySpan<double> values)
    {
        EnsureRoom(values.Length);
        values.CopyTo(items.AsSpan(Count));
        Count += values.Length;
    }

    /// <summary>A trimmed copy of the values.</summary>
    public double[] ToArray() => Values.ToArray();

    private void EnsureRoom(int extra)
    {
        if (Count + extra > items.Length)
        {
            Array.Resize(ref items, Math.Max(items.Length * 2, Count + extra));
        }
    }
}
