# Regenerate: python3 draw_icons.py, then screenshot each *.html with headless Chromium at its size
# (see DEVELOPERS.md), then shrink each to 12 colours with `pngquant 12 --speed 1` and `optipng -o7`. The PNGs in ../icons are the committed output;
# the 192 px maskable render is not shipped (the manifest needs 192 and 512 px icons and one maskable, 512 px).
# Draws Lensplane's icon: a lens and the plane it moves to, with a ray crossing both.
def svg(size_frame, maskable):
    # All coordinates on a 512 grid; the maskable version keeps content in the 80% safe circle.
    s = 0.72 if maskable else 0.86
    bg = '<rect width="512" height="512" fill="#12484c"/>' if maskable else '<rect x="16" y="16" width="480" height="480" rx="112" fill="#12484c"/>'
    return f'''<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 512 512" width="{size_frame}" height="{size_frame}">
{bg}
<g transform="translate(256 256) scale({s}) translate(-256 -256)">
  <path d="M196 96 Q268 256 196 416 Q124 256 196 96 Z" fill="#bfe3df" stroke="#e8f4f2" stroke-width="10" stroke-linejoin="round"/>
  <rect x="318" y="112" width="22" height="288" rx="11" fill="#f0b43c"/>
  <path d="M64 256 H196 L329 196 H448" fill="none" stroke="#e8f4f2" stroke-width="18" stroke-linecap="round" stroke-linejoin="round"/>
  <path d="M64 256 H196 L329 316 H448" fill="none" stroke="#e8f4f2" stroke-width="18" stroke-linecap="round" stroke-linejoin="round" opacity="0.55"/>
</g>
</svg>'''
open('icon.svg','w').write(svg(512, False))
open('icon-maskable.svg','w').write(svg(512, True))
for name in ['icon', 'icon-maskable']:
    for px in [192, 512]:
        open(f'{name}-{px}.html','w').write(f'<html><body style="margin:0;background:transparent">' + open(f'{name}.svg').read().replace('width="512" height="512"', f'width="{px}" height="{px}"', 1) + '</body></html>')
