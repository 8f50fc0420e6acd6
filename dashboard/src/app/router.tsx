import { BrowserRouter, Navigate, Route, Routes } from 'react-router';
import { paths } from '../lib/paths';
import { AppLayout } from './layout/app-layout';
import { NotFoundPage } from './routes/not-found';
import { SitePage } from './routes/site';
import { SitesPage } from './routes/sites';

export function AppRouter() {
  return (
    <BrowserRouter>
      <Routes>
        <Route element={<AppLayout />}>
          <Route path={paths.home.path} element={<Navigate to={paths.sites.href()} replace />} />
          <Route path={paths.sites.path} element={<SitesPage />} />
          <Route path={paths.site.path} element={<SitePage />} />
          <Route path="*" element={<NotFoundPage />} />
        </Route>
      </Routes>
    </BrowserRouter>
  );
}
