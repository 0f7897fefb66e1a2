namespace Patchproof.Core.Captures.Reading;

/// <summary>An append-only array that grows by half its size; the reader sizes it from the file length to avoid growing.</summary>
internal sealed class GrowableBuffer<T>
    where T : unmanaged
{
    private T[] items;

    public GrowableBuffer(int initialCapacity) => items = new T[Math.Max(16, initialCapacity)];

    public int Count { get; private set; }

    public void Add(T value)
    {
        if (Count == items.Length)
        {
            Grow();
        }

        items[Count++] = value;
    }

    /// <summary>The items as memory over the buffer's own array (no copy; spare capacity stays allocated when it is small).</summary>
    public Memory<T> ToMemory()
    {
        if (items.Length - Count > Math.Max(1024, Count / 8))
        {
            Array.Resize(ref items, Count);
        }

        return items.AsMemory(0, Count);
    }

    private void Grow()
    {
        var next = (long)items.Length + Math.Max(items.Length / 2, 1024);
        Array.Resize(ref items, (int)Math.Min(next, Array.MaxLength));
    }
}
