using System.Buffers.Binary;
using System.IO.Compression;

namespace SettingLint.Reporting.Tests.Html;

/// <summary>
/// A minimal PNG reader for screenshots: 8-bit greyscale, RGB or RGBA, not interlaced (what Chromium writes).
/// Pixels are decoded from the zlib stream of the IDAT chunks and un-filtered row by row (PNG specification, clause 9).
/// </summary>
internal sealed class HtmlPng
{
    private readonly byte[] _pixels;
    private readonly int _channels;

    private HtmlPng(int width, int height, int channels, byte[] pixels)
    {
        Width = width;
        Height = height;
        _channels = channels;
        _pixels = pixels;
    }

    public int Width { get; }

    public int Height { get; }

    /// <summary>The colour at a pixel as 0xRRGGBB.</summary>
    public int Rgb(int x, int y)
    {
        var i = ((y * Width) + x) * _channels;
        return _channels switch
        {
            1 or 2 => (_pixels[i] << 16) | (_pixels[i] << 8) | _pixels[i],
            _ => (_pixels[i] << 16) | (_pixels[i + 1] << 8) | _pixels[i + 2],
        };
    }

    public static HtmlPng Read(byte[] file)
    {
        ReadOnlySpan<byte> signature = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A];
        if (file.Length < 8 || !file.AsSpan(0, 8).SequenceEqual(signature)) throw new InvalidDataException("Not a PNG file.");
        int width = 0, height = 0, channels = 0;
        using var idat = new MemoryStream();
        for (var pos = 8; pos + 8 <= file.Length;)
        {
            var length = BinaryPrimitives.ReadInt32BigEndian(file.AsSpan(pos));
            var type = System.Text.Encoding.ASCII.GetString(file, pos + 4, 4);
            var data = file.AsSpan(pos + 8, length);
            if (type == "IHDR")
            {
                width = BinaryPrimitives.ReadInt32BigEndian(data);
                height = BinaryPrimitives.ReadInt32BigEndian(data[4..]);
                var depth = data[8];
                var color = data[9];
                var interlace = data[12];
                if (depth != 8 || interlace != 0) throw new InvalidDataException($"Unsupported PNG: depth {depth}, interlace {interlace}.");
                channels = color switch { 0 => 1, 2 => 3, 4 => 2, 6 => 4, _ => throw new InvalidDataException($"Unsupported PNG colour type {color}.") };
            }
            else if (type == "IDAT")
            {
                idat.Write(data);
            }
            else if (type == "IEND")
            {
                break;
            }
            pos += 12 + length;
        }
        idat.Position = 0;
        using var z = new ZLibStream(idat, CompressionMode.Decompress);
        using var raw = new MemoryStream();
        z.CopyTo(raw);
        var bytes = raw.ToArray();
        var stride = width * channels;
        var pixels = new byte[stride * height];
        for (var y = 0; y < height; y++)
        {
            var filter = bytes[y * (stride + 1)];
            var src = bytes.AsSpan((y * (stride + 1)) + 1, stride);
            var row = pixels.AsSpan(y * stride, stride);
            var prior = y > 0 ? pixels.AsSpan((y - 1) * stride, stride) : new byte[stride];
            for (var i = 0; i < stride; i++)
            {
                int a = i >= channels ? row[i - channels] : 0, b = prior[i], c = i >= channels ? prior[i - channels] : 0;
                row[i] = (byte)(src[i] + filter switch
                {
                    0 => 0,
                    1 => a,
                    2 => b,
                    3 => (a + b) / 2,
                    4 => Paeth(a, b, c),
                    _ => throw new InvalidDataException($"Unknown PNG filter {filter}."),
                });
            }
        }
        return new HtmlPng(width, height, channels, pixels);
    }

    private static int Paeth(int a, int b, int c)
    {
        var p = a + b - c;
        var (pa, pb, pc) = (Math.Abs(p - a), Math.Abs(p - b), Math.Abs(p - c));
        return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
    }
}
