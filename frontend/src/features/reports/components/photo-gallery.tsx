import CloseIcon from '@mui/icons-material/Close';
import DeleteOutlineIcon from '@mui/icons-material/DeleteOutlined';
import Box from '@mui/material/Box';
import ButtonBase from '@mui/material/ButtonBase';
import Dialog from '@mui/material/Dialog';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import IconButton from '@mui/material/IconButton';
import Link from '@mui/material/Link';
import Typography from '@mui/material/Typography';
import type { Attachment } from '@loamline/shared-types';
import { useState } from 'react';

/**
 * Photos as thumbnails (the server's small JPEG); each opens the full image in a dialog, with a
 * link to the file itself. Files are same-origin and cookie-authenticated, so a plain <img> works.
 */
export function PhotoGallery({
  photos,
  onDelete,
}: {
  photos: Attachment[];
  /** Workshop, while a draft: a delete button on each */
  onDelete?: (photo: Attachment) => void;
}) {
  const [open, setOpen] = useState<Attachment | null>(null);
  return (
    <>
      <Box
        component="ul"
        className="report-photos"
        sx={{
          listStyle: 'none',
          p: 0,
          m: 0,
          display: 'grid',
          gridTemplateColumns: 'repeat(auto-fill, minmax(120px, 1fr))',
          gap: 1.5,
        }}
      >
        {photos.map((p) => (
          <Box component="li" key={p.id} sx={{ position: 'relative' }}>
            <ButtonBase
              onClick={() => setOpen(p)}
              aria-label={`Open photo ${p.name}`}
              sx={{
                display: 'block',
                width: '100%',
                borderRadius: 2,
                overflow: 'hidden',
                border: 1,
                borderColor: 'divider',
              }}
            >
              <Box
                component="img"
                src={p.thumbnailUrl ?? p.url}
                alt=""
                loading="lazy"
                sx={{
                  display: 'block',
                  width: '100%',
                  aspectRatio: '4 / 3',
                  objectFit: 'cover',
                  bgcolor: 'grey.100',
                }}
              />
            </ButtonBase>
            <Typography variant="caption" component="p" sx={{ mt: 0.5, overflowWrap: 'anywhere' }}>
              {p.name}
            </Typography>
            {onDelete && (
              <IconButton
                aria-label={`Delete photo ${p.name}`}
                onClick={() => onDelete(p)}
                size="small"
                className="report-no-print"
                sx={{
                  position: 'absolute',
                  top: 4,
                  right: 4,
                  bgcolor: 'background.paper',
                  '&:hover': { bgcolor: 'background.paper' },
                }}
              >
                <DeleteOutlineIcon fontSize="small" />
              </IconButton>
            )}
          </Box>
        ))}
      </Box>
      <Dialog open={!!open} onClose={() => setOpen(null)} maxWidth="lg" aria-labelledby="photo-title">
        {open && (
          <>
            <DialogTitle id="photo-title" sx={{ pr: 6, overflowWrap: 'anywhere' }}>
              {open.name}
              <IconButton
                aria-label="Close"
                onClick={() => setOpen(null)}
                sx={{ position: 'absolute', right: 8, top: 8 }}
              >
                <CloseIcon />
              </IconButton>
            </DialogTitle>
            <DialogContent>
              <Box
                component="img"
                src={open.url}
                alt={`Photo: ${open.name}`}
                sx={{ display: 'block', maxWidth: '100%', maxHeight: '75vh', mx: 'auto' }}
              />
              <Link href={open.url} target="_blank" rel="noopener" sx={{ display: 'inline-block', mt: 1 }}>
                Open the full-size file
              </Link>
            </DialogContent>
          </>
        )}
      </Dialog>
    </>
  );
}
